import { useId, type ReactNode } from 'react';
import { SelectField, TextField } from '../fields';
import { Typeset } from '../typeset';
import { ALGORITHM_NAMES, COLLISION_NAMES, DEFAULTS, EE_ALGORITHM_NAMES, JET_MODE_NAMES, NUMERIC_FIELDS, type FieldProblems } from './processing-settings';

function Options({ names }: { names: Record<string, string> }) {
  return Object.entries(names).map(([value, name]) => (
    <option key={value} value={value}>
      {name}
    </option>
  ));
}

/** A checkbox with its hint, and what is wrong with it (marked invalid for screen readers). */
function Check({ name, label, hint, defaultChecked, error }: { name: string; label: string; hint: ReactNode; defaultChecked: boolean; error?: string }) {
  const errorId = useId();
  return (
    <label className="flex items-start gap-2 text-sm text-ink">
      <input
        type="checkbox"
        name={name}
        defaultChecked={defaultChecked}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? errorId : undefined}
        className="mt-0.5 h-4 w-4 accent-accent"
      />
      <span>
        {label}
        <span className="block text-xs text-ink-soft">{hint}</span>
        {error && (
          <span id={errorId} className="block text-xs font-medium text-danger">
            {error}
          </span>
        )}
      </span>
    </label>
  );
}

function Group({ title, lead, children }: { title: string; lead: ReactNode; children: ReactNode }) {
  return (
    <fieldset className="space-y-3 border-t border-ink/10 pt-4">
      <legend className="text-sm font-semibold text-ink">{title}</legend>
      <p className="text-xs text-ink-soft">{lead}</p>
      {children}
    </fieldset>
  );
}

const GENERAL = ['R', 'ptMin', 'yMax', 'maxJets', 'zCut', 'beta', 'R0', 'ktCut'];

/** The processing settings of an upload, prefilled with the defaults; a problem shows beside its field. */
export function SettingsFields({ disabled, errors = {} }: { disabled?: boolean; errors?: FieldProblems }) {
  const numberField = (name: string) => {
    const field = NUMERIC_FIELDS.find((f) => f.name === name)!;
    return (
      <TextField
        key={field.name}
        label={<Typeset text={field.label} />}
        name={field.name}
        hint={field.hint}
        error={errors[field.name]}
        inputMode="decimal"
        defaultValue={field.initial}
      />
    );
  };
  return (
    <fieldset disabled={disabled} className="space-y-4">
      <p className="text-xs text-ink-soft">
        Defaults are filled in. For whole events every setting applies. For files of single jets the algorithm is not
        used, and R sets ln(R/Δ) and SoftDrop&apos;s default R0.
      </p>
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
        <SelectField
          label="Collision"
          name="collision"
          defaultValue={DEFAULTS.collision}
          hint="e+e−: jets in energy and angle, declustered in θ and kₜ = E sin θ."
          error={errors.collision}
        >
          <Options names={COLLISION_NAMES} />
        </SelectField>
        <SelectField label="Jet algorithm" name="algorithm" defaultValue={DEFAULTS.jet.algorithm} hint="Finds the jets in hadron-collider events." error={errors.algorithm}>
          <Options names={ALGORITHM_NAMES} />
        </SelectField>
        <SelectField
          label="Jets"
          name="jetMode"
          defaultValue="inclusive"
          hint="Exclusive: the whole event clustered to n jets or up to a cut (kt or C/A; e+e− Durham and Cambridge)."
          error={errors.jetMode}
        >
          <Options names={JET_MODE_NAMES} />
        </SelectField>
        <TextField
          label={<Typeset text="n, d_cut or y_cut" />}
          name="exclusiveValue"
          hint="For exclusive jets: the number of jets, or the cut."
          error={errors.exclusiveValue}
          inputMode="decimal"
          defaultValue=""
        />
        {GENERAL.map(numberField)}
      </div>
      <Group title="e+e− jets" lead="Used when the collision is e+e−: jets are kept by energy (the pt and |y| cuts do not apply).">
        <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
          <SelectField
            label="e+e− algorithm"
            name="eeAlgorithm"
            defaultValue={DEFAULTS.ee.algorithm}
            hint="Durham: exactly n jets or y_cut; Cambridge: y_cut; generalised kt: inclusive, radius R."
            error={errors.eeAlgorithm}
          >
            <Options names={EE_ALGORITHM_NAMES} />
          </SelectField>
          {['eeP', 'eMin'].map(numberField)}
        </div>
      </Group>
      <Group title="Constituents" lead="Which particles take part, before jets are found (or before a single jet is re-clustered). Removed particles are counted by rule.">
        <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
          {numberField('constituentPtMin')}
          <SelectField label="Limit in" name="rapidityKind" defaultValue={DEFAULTS.particles.rapidityKind} hint="Rapidity y or pseudorapidity η." error={errors.rapidityKind}>
            <Options names={{ y: 'rapidity |y|', eta: 'pseudorapidity |η|' }} />
          </SelectField>
          {numberField('rapidityMax')}
          <TextField
            label="Only these pids"
            name="pidInclude"
            hint="Particle codes, comma-separated; a code covers its antiparticle. Blank: all."
            error={errors.pidInclude}
            defaultValue=""
          />
          <TextField label="Drop these pids" name="pidExclude" hint="Particle codes, comma-separated. Blank: none." error={errors.pidExclude} defaultValue="" />
        </div>
        <div className="grid gap-3 sm:grid-cols-2">
          <Check
            name="chargedOnly"
            label="Charged particles only"
            hint={'From each record\u2019s "charge", else its "pid" (particle numbering scheme).'}
            defaultChecked={DEFAULTS.particles.chargedOnly}
            error={errors.chargedOnly}
          />
          <Check
            name="dropNeutrinos"
            label="Drop neutrinos"
            hint="Common practice for particle-level jets. Needs pid."
            defaultChecked={DEFAULTS.particles.dropNeutrinos}
            error={errors.dropNeutrinos}
          />
        </div>
      </Group>
      <Group title="Stored results" lead="What each jet keeps beside its primary splittings.">
        <div className="grid gap-3 sm:grid-cols-2">
          <Check
            name="flavourTags"
            label="Flavour tagging (b, c, light)"
            hint="Ghost association of the heavy-flavour hadrons: HepMC3 status-2 hadrons, or the records' tag particles. Whole events only."
            defaultChecked={DEFAULTS.flavourTags}
            error={errors.flavourTags}
          />
          <Check
            name="fullTree"
            label="Keep every splitting of the Cambridge/Aachen tree"
            hint="Needed for the full-tree export; takes more space. Off: primary splittings only."
            defaultChecked={DEFAULTS.fullTree}
            error={errors.fullTree}
          />
        </div>
      </Group>
    </fieldset>
  );
}
