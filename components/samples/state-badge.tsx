import { pill } from '../role-badge';
import type { SampleState } from '@/models/vocabulary';

const looks: Record<SampleState, { style: string; meaning: string }> = {
  queued: { style: 'bg-paper-sunk text-ink-soft border-ink/15', meaning: 'Waiting for a free worker' },
  running: { style: 'bg-warn-soft text-warn border-warn/30', meaning: 'Being processed now' },
  done: { style: 'bg-accent-soft text-accent-strong border-accent/30', meaning: 'Processed: jets and plane ready' },
  failed: { style: 'bg-danger-soft text-danger border-danger/30', meaning: 'Stopped at a problem in the file; nothing was kept' },
  cancelled: { style: 'bg-paper-raised text-ink-faint border-ink/15', meaning: 'Stopped by a person; nothing was kept' },
};

/** A sample's processing state as a small pill; the tooltip says what it means. */
export function StateBadge({ state }: { state: SampleState }) {
  const { style, meaning } = looks[state] ?? looks.queued;
  return (
    <span
      className={`${pill} ${style}`}
      title={meaning}
      data-state={state}
    >
      {state}
    </span>
  );
}
