import { inlineSelectClass } from '../fields';

/** The entries threshold of a Contrast's or Separation's mask, applied when the field is left. */
export function MinEntriesField({ value, onChange, suffix }: { value: number; onChange: (next: number) => void; suffix?: string }) {
  return (
    <label className="flex items-center gap-2 text-ink-soft">
      Mask bins with fewer entries than
      <input
        aria-label="Minimum entries"
        className={`${inlineSelectClass} w-20`}
        type="number"
        min={0}
        defaultValue={value}
        onBlur={(event) => {
          const next = Number(event.target.value);
          if (Number.isInteger(next) && next >= 0 && next !== value) onChange(next);
        }}
      />
      {suffix}
    </label>
  );
}
