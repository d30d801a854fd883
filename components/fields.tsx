import { useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes, type TextareaHTMLAttributes } from 'react';

const controlLook =
  'rounded-md border border-ink/20 bg-paper-raised text-sm text-ink placeholder:text-ink-faint ' +
  'focus:border-accent focus:outline-none focus:ring-2 focus:ring-accent/25 disabled:bg-paper-sunk disabled:text-ink-soft';

/** A full-width input, textarea or select. */
export const controlClass = `${controlLook} block w-full px-3 py-2`;

/** A small select that sits in a row of a list or table. */
export const inlineSelectClass = `${controlLook} h-8 px-2`;

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
