'use client';

import { Button } from '../button';
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
