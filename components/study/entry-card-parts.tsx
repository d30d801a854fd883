'use client';

import type { Entry } from '../api-types';
import { Button } from '../button';
import { formatDateTime } from '../format';
import { ConfirmButton } from '../confirm-button';
import { Notice } from '../notice';
import { useAction } from '../use-action';

export interface EntryActions {
  /** Absent where the entry cannot move that way (first or last). */
  moveUp?: () => Promise<unknown>;
  moveDown?: () => Promise<unknown>;
  remove: () => Promise<unknown>;
}

function MoveButton({ label, glyph, step, busy, onMove }: { label: string; glyph: string; step?: () => Promise<unknown>; busy: boolean; onMove: (step: () => Promise<unknown>) => unknown }) {
  return (
    <Button size="sm" variant="ghost" aria-label={label} title={label} disabled={!step || busy} onClick={() => step && onMove(step)}>
      <span aria-hidden>{glyph}</span>
    </Button>
  );
}

/** Move and delete buttons of an entry in the study's list, with the failure of a move shown under them. */
export function EntryActionButtons({ actions, what, children }: { actions: EntryActions; what: string; children?: React.ReactNode }) {
  const move = useAction((step: () => Promise<unknown>) => step());
  return (
    <>
      <footer className="flex flex-wrap items-center justify-end gap-1.5 border-t border-ink/10 px-5 py-2">
        {children}
        <MoveButton label="Move up" glyph="↑" step={actions.moveUp} busy={move.pending} onMove={move.run} />
        <MoveButton label="Move down" glyph="↓" step={actions.moveDown} busy={move.pending} onMove={move.run} />
        <ConfirmButton label="Delete" question={`Delete this ${what}?`} confirmLabel={`Delete ${what}`} onConfirm={actions.remove} />
      </footer>
      {move.error && (
        <Notice tone="error" className="mx-5 mb-3">
          {move.error}
        </Notice>
      )}
    </>
  );
}

const BADGES = {
  note: ['Note', 'bg-accent-soft/70 text-accent-strong'],
  map: ['Map', 'bg-warn-soft text-warn'],
  contrast: ['Contrast', 'bg-warn-soft text-warn'],
  separation: ['Separation', 'bg-warn-soft text-warn'],
} as const;

/** The top line of an entry in the study's list: its kind, its title, and who changed it last and when. */
export function EntryHeader({ entry, kind }: { entry: Entry; kind: keyof typeof BADGES }) {
  const [name, look] = BADGES[kind];
  return (
    <header className="flex flex-wrap items-center gap-x-3 gap-y-1 border-b border-ink/10 px-5 py-3">
      <span className={`rounded px-1.5 py-0.5 text-[0.65rem] font-semibold uppercase tracking-wider ${look}`}>{name}</span>
      {entry.title && <h2 className="min-w-0 flex-1 font-semibold tracking-tight break-words">{entry.title}</h2>}
      <span className="w-full text-xs text-ink-faint sm:ml-auto sm:w-auto">
        {formatDateTime(entry.updatedAt)}
        {entry.updatedBy && ` · ${entry.updatedBy.name}`}
      </span>
    </header>
  );
}
