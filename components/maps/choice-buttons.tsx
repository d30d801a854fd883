/** Two or more mutually exclusive choices as a row of pressed/unpressed buttons. */
export function ChoiceButtons<T extends string>({ label, value, options, onChange }: { label: string; value: T; options: Array<[T, string]>; onChange: (next: T) => void }) {
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
