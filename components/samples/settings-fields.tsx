import { SelectField, TextField } from '../fields';
import { ALGORITHM_NAMES, DEFAULT_SETTINGS, NUMERIC_FIELDS, defaultText } from './processing-settings';

/** The processing settings of an upload, prefilled with the defaults. */
export function SettingsFields({ disabled }: { disabled?: boolean }) {
  return (
    <fieldset disabled={disabled} className="space-y-4">
      <legend className="font-semibold">Processing settings</legend>
      <p className="-mt-2 text-xs text-ink-soft">
        Defaults are filled in. The jet algorithm, R and the cuts find jets in whole events; files of single jets use the
        cuts and R (for ln(R/Δ)) only.
      </p>
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
        <SelectField label="Jet algorithm" name="algorithm" defaultValue={DEFAULT_SETTINGS.algorithm}>
          {Object.entries(ALGORITHM_NAMES).map(([value, name]) => (
            <option key={value} value={value}>
              {name}
            </option>
          ))}
        </SelectField>
        {NUMERIC_FIELDS.map((field) => (
          <TextField
            key={field.name}
            label={field.label}
            name={field.name}
            hint={field.hint}
            inputMode="decimal"
            defaultValue={defaultText(field.name)}
          />
        ))}
      </div>
    </fieldset>
  );
}
