'use client';

import { useState } from 'react';
import { Button } from './button';
import { Notice } from './notice';
import { useAction } from './use-action';

interface ConfirmButtonProps {
  label: string;
  /** Asked before anything happens, e.g. "Delete this note?". */
  question: string;
  confirmLabel: string;
  onConfirm: () => Promise<unknown>;
  size?: 'sm' | 'md';
}

/** A destructive action that asks once, in place, before it runs; shows the error if it fails. */
export function ConfirmButton({ label, question, confirmLabel, onConfirm, size = 'sm' }: ConfirmButtonProps) {
  const [asking, setAsking] = useState(false);
  const { run, pending, error } = useAction(onConfirm);

  if (!asking) {
    return (
      <Button variant="danger" size={size} onClick={() => setAsking(true)}>
        {label}
      </Button>
    );
  }
  return (
    <div className="flex flex-wrap items-center gap-2" role="group" aria-label={question}>
      <span className="text-sm text-ink">{question}</span>
      <Button variant="danger" size={size} disabled={pending} onClick={async () => (await run()) && setAsking(false)}>
        {pending ? 'Working…' : confirmLabel}
      </Button>
      <Button variant="ghost" size={size} disabled={pending} onClick={() => setAsking(false)}>
        Cancel
      </Button>
      {error && (
        <Notice tone="error" className="basis-full">
          {error}
        </Notice>
      )}
    </div>
  );
}
