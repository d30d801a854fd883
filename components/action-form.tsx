'use client';

import { createContext, useContext, useState, type FormEvent, type ReactNode } from 'react';
import { Button } from './button';
import { Notice } from './notice';
import { useAction } from './use-action';

const PendingContext = createContext(false);

interface ActionFormProps {
  /** Receives the form's fields; throw (e.g. an ApiError) to show a message under the form. */
  onSubmit: (data: FormData) => Promise<unknown>;
  /** Clear the fields after a successful submit (forms that create something). */
  resetOnSuccess?: boolean;
  /** Shown after a successful submit until the next one. */
  successMessage?: string;
  className?: string;
  children: ReactNode;
  'aria-label'?: string;
}

/** A form that submits through an async handler, disables its submit button meanwhile and shows errors. */
export function ActionForm({ onSubmit, resetOnSuccess, successMessage, className, children, ...rest }: ActionFormProps) {
  const { run, pending, error } = useAction(onSubmit);
  const [succeeded, setSucceeded] = useState(false);

  async function handleSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = event.currentTarget;
    setSucceeded(false);
    const ok = await run(new FormData(form));
    if (ok && resetOnSuccess) form.reset();
    setSucceeded(ok);
  }

  return (
    <form onSubmit={handleSubmit} className={className ?? 'space-y-4'} aria-label={rest['aria-label']}>
      <PendingContext.Provider value={pending}>{children}</PendingContext.Provider>
      {error && <Notice tone="error">{error}</Notice>}
      {succeeded && successMessage && <Notice tone="success">{successMessage}</Notice>}
    </form>
  );
}

/** The submit button of the surrounding ActionForm. */
export function SubmitButton({
  children,
  pendingLabel,
  variant = 'primary',
  size,
}: {
  children: ReactNode;
  pendingLabel?: string;
  variant?: 'primary' | 'secondary' | 'danger';
  size?: 'sm' | 'md';
}) {
  const pending = useContext(PendingContext);
  return (
    <Button type="submit" variant={variant} size={size} disabled={pending} aria-busy={pending}>
      {pending ? (pendingLabel ?? 'Saving…') : children}
    </Button>
  );
}

/** Reads a text field of a submitted form, trimmed unless asked not to (passwords). */
export function field(data: FormData, name: string, trim = true): string {
  const value = data.get(name);
  if (typeof value !== 'string') return '';
  return trim ? value.trim() : value;
}

/** Submit and Cancel side by side, for forms that open in place. */
export function SubmitOrCancel({ label, pendingLabel, onCancel }: { label: string; pendingLabel?: string; onCancel: () => void }) {
  return (
    <div className="flex gap-2">
      <SubmitButton pendingLabel={pendingLabel}>{label}</SubmitButton>
      <Button variant="ghost" onClick={onCancel}>
        Cancel
      </Button>
    </div>
  );
}
