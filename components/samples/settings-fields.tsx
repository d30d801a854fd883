import { SelectField, TextField } from '../fields';
import { Typeset } from '../typeset';
import { ALGORITHM_NAMES, DEFAULTS, NUMERIC_FIELDS, type FieldProblems } from './processing-settings';

/** The processing settings of an upload, prefilled with the defaults; a problem shows beside its field. */
export function SettingsFields({ disabled, errors = {} }: { disabled?: boolean; errors?: FieldProblems }) {
  return (
    <fieldset disabled={disabled} className="space-y-4">
      <p className="text-xs text-ink-soft">
        Defaults are filled in. For whole events every setting applies. For files of single jets the algorithm is not
        used, and R sets ln(R/Δ) and SoftDrop&apos;s default R0.
      </p>
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
        <SelectField label="Jet algorithm" name="algorithm" defaultValue={DEFAULTS.jet.algorithm} hint="Finds the jets in events." error={errors.algorithm}>
          {Object.entries(ALGORITHM_NAMES).map(([value, name]) => (
            <option key={value} value={value}>
              {name}
            </option>
          ))}
        </SelectField>
        {NUMERIC_FIELDS.map((field) => (
          <TextField
            key={field.name}
            label={<Typeset text={field.label} />}
            name={field.name}
            hint={field.hint}
            error={errors[field.name]}
            inputMode="decimal"
            defaultValue={field.initial}
          />
        ))}
      </div>
      <label className="flex items-start gap-2 text-sm text-ink">
        <input type="checkbox" name="fullTree" defaultChecked={DEFAULTS.fullTree} className="mt-0.5 h-4 w-4 accent-accent" />
        <span>
          Keep every splitting of the Cambridge/Aachen tree
          <span className="block text-xs text-ink-soft">Needed for the full-tree export; takes more space. Off: primary splittings only.</span>
        </span>
      </label>
    </fieldset>
  );
}
