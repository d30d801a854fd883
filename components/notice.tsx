import type { ReactNode } from 'react';

type Tone = 'error' | 'success' | 'info';

const tones: Record<Tone, string> = {
  error: 'border-danger/25 bg-danger-soft text-danger',
  success: 'border-accent/25 bg-accent-soft text-accent-strong',
  info: 'border-ink/10 bg-paper-sunk text-ink-soft',
};

/** A short message box; errors are announced to screen readers. */
export function Notice({ tone = 'info', className = '', children }: { tone?: Tone; className?: string; children: ReactNode }) {
  return (
    <div
      role={tone === 'error' ? 'alert' : 'status'}
      className={`rounded-md border px-3 py-2 text-sm ${tones[tone]} ${className}`}
    >
      {children}
    </div>
  );
}
