import { inlineSelectClass } from '../fields';
import { AXIS_LABELS, BIN_SIZES, type HorizontalCoordinate, type PlaneChoice } from './plane-view-settings';

/** Two or more mutually exclusive choices as a row of pressed/unpressed buttons. */
function ChoiceButtons<T extends string>({ label, value, options, onChange }: { label: string; value: T; options: [T, string][]; onChange: (next: T) => void }) {
  return (
    <div role="group" aria-label={label} className="inline-flex overflow-hidden rounded-md border border-ink/15">
      {options.map(([option, text]) => (
        <button
          key={option}
          type="button"
          aria-pressed={value === option}
          onClick={() => onChange(option)}
          className={`h-8 px-3 text-sm font-medium ${value === option ? 'bg-accent text-white' : 'bg-paper-raised text-ink-soft hover:bg-paper-sunk hover:text-ink'}`}
        >
          {text}
        </button>
      ))}
    </div>
  );
}

/** The horizontal coordinate and the bin size of the plane. */
export function PlaneControls({ choice, onChange, collision = 'hadron' }: { choice: PlaneChoice; onChange: (next: PlaneChoice) => void; collision?: 'hadron' | 'ee' }) {
  const horizontalOptions = Object.entries(AXIS_LABELS[collision].horizontal) as [HorizontalCoordinate, string][];
  return (
    <div className="flex flex-wrap items-center gap-3">
      <ChoiceButtons label="Horizontal axis" value={choice.horizontal} options={horizontalOptions} onChange={(horizontal) => onChange({ ...choice, horizontal })} />
      <label className="flex items-center gap-2 text-sm text-ink-soft">
        Bin size
        <select className={inlineSelectClass} value={choice.binSize} onChange={(event) => onChange({ ...choice, binSize: Number(event.target.value) })}>
          {BIN_SIZES.map((size) => (
            <option key={size} value={size}>
              {size}
            </option>
          ))}
        </select>
      </label>
    </div>
  );
}
