import { useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes, type TextareaHTMLAttributes } from 'react';

export const controlClass =
  'block w-full rounded-md border border-ink/20 bg-paper-raised px-3 py-2 text-sm text-ink ' +
  'placeholder:text-ink-faint focus:border-accent focus:outline-none focus:ring-2 focus:ring-accent/25 ' +
  'disabled:bg-paper-sunk disabled:text-ink-soft';

interface LabelProps {
  label: string;
  hint?: ReactNode;
}

/** A label above a control and an optional hint under it; `control` receives the id and styling. */
function Labelled({
  label,
  hint,
  control,
}: LabelProps & { control: (props: { id: string; className: string; 'aria-describedby'?: string }) => ReactNode }) {
  const id = useId();
  return (
    <div className="space-y-1.5">
      <label htmlFor={id} className="block text-sm font-medium text-ink">
        {label}
      </label>
      {control({ id, className: controlClass, 'aria-describedby': hint ? `${id}-hint` : undefined })}
      {hint && (
        <p id={`${id}-hint`} className="text-xs text-ink-soft">
          {hint}
        </p>
      )}
    </div>
  );
}

export function TextField({ label, hint, ...input }: LabelProps & InputHTMLAttributes<HTMLInputElement>) {
  return <Labelled label={label} hint={hint} control={(props) => <input {...props} {...input} />} />;
}

export function TextArea({ label, hint, ...area }: LabelProps & TextareaHTMLAttributes<HTMLTextAreaElement>) {
  return <Labelled label={label} hint={hint} control={(props) => <textarea {...props} {...area} />} />;
}

export function SelectField({ label, hint, ...select }: LabelProps & SelectHTMLAttributes<HTMLSelectElement>) {
  return <Labelled label={label} hint={hint} control={(props) => <select {...props} {...select} />} />;
}
