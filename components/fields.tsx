import { PASSWORD_MIN } from '@/models/vocabulary';
import { useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes, type TextareaHTMLAttributes } from 'react';

const controlLook =
  'rounded-md border border-ink/20 bg-paper-raised text-sm text-ink placeholder:text-ink-faint ' +
  'focus:border-accent focus:outline-none focus:ring-2 focus:ring-accent/25 disabled:bg-paper-sunk disabled:text-ink-soft';

/** A full-width input, textarea or select. */
export const controlClass = `${controlLook} block w-full px-3 py-2`;

/** A small select that sits in a row of a list or table. */
export const inlineSelectClass = `${controlLook} h-8 px-2`;

interface LabelProps {
  label: ReactNode;
  hint?: ReactNode;
  /** What is wrong with the value: shown under the control, which is marked invalid for screen readers. */
  error?: string;
}

interface ControlProps {
  id: string;
  className: string;
  'aria-describedby'?: string;
  'aria-invalid'?: true;
}

/** A label above a control, an optional hint and error under it; `control` receives the id and styling. */
function Labelled({ label, hint, error, control }: LabelProps & { control: (props: ControlProps) => ReactNode }) {
  const id = useId();
  const described = [error && `${id}-error`, hint && `${id}-hint`].filter(Boolean).join(' ');
  return (
    <div className="space-y-1.5">
      <label htmlFor={id} className="block text-sm font-medium text-ink">
        {label}
      </label>
      {control({
        id,
        className: `${controlClass}${error ? ' border-danger' : ''}`,
        'aria-describedby': described || undefined,
        'aria-invalid': error ? true : undefined,
      })}
      {error && (
        <p id={`${id}-error`} className="text-xs font-medium text-danger">
          {error}
        </p>
      )}
      {hint && (
        <p id={`${id}-hint`} className="text-xs text-ink-soft">
          {hint}
        </p>
      )}
    </div>
  );
}

export function TextField({ label, hint, error, ...input }: LabelProps & InputHTMLAttributes<HTMLInputElement>) {
  return <Labelled label={label} hint={hint} error={error} control={(props) => <input {...props} {...input} />} />;
}

export function TextArea({ label, hint, error, ...area }: LabelProps & TextareaHTMLAttributes<HTMLTextAreaElement>) {
  return <Labelled label={label} hint={hint} error={error} control={(props) => <textarea {...props} {...area} />} />;
}

export function SelectField({ label, hint, error, ...select }: LabelProps & SelectHTMLAttributes<HTMLSelectElement>) {
  return <Labelled label={label} hint={hint} error={error} control={(props) => <select {...props} {...select} />} />;
}

/** A password being chosen (sign-up, invitation, reset, profile): the browser may suggest one; the minimum is named. */
export function NewPasswordField({ label = 'Password', name = 'password', autoFocus }: { label?: string; name?: string; autoFocus?: boolean }) {
  return (
    <TextField
      label={label}
      name={name}
      type="password"
      autoComplete="new-password"
      minLength={PASSWORD_MIN}
      required
      autoFocus={autoFocus}
      hint={`At least ${PASSWORD_MIN} characters.`}
    />
  );
}
