'use client';

import { useState } from 'react';
import type { Entry } from '../api-types';
import { Button } from '../button';
import { ConfirmButton } from '../confirm-button';
import { formatDateTime } from '../format';
import { MarkdownView } from '../markdown-view';
import { Notice } from '../notice';
import { useAction } from '../use-action';
import { NoteEditor, type NoteDraft } from './note-editor';

export interface NoteActions {
  save: (draft: NoteDraft) => Promise<unknown>;
  remove: () => Promise<unknown>;
  /** Absent where the note cannot move that way (first or last). */
  moveUp?: () => Promise<unknown>;
  moveDown?: () => Promise<unknown>;
}

interface MoveButtonProps {
  label: string;
  glyph: string;
  step?: () => Promise<unknown>;
  busy: boolean;
  onMove: (step: () => Promise<unknown>) => unknown;
}

function MoveButton({ label, glyph, step, busy, onMove }: MoveButtonProps) {
  return (
    <Button size="sm" variant="ghost" aria-label={label} title={label} disabled={!step || busy} onClick={() => step && onMove(step)}>
      <span aria-hidden>{glyph}</span>
    </Button>
  );
}

/** One Note entry: its rendered Markdown, and for editors the controls to edit, move and delete it. */
export function NoteCard({ entry, actions }: { entry: Entry; actions?: NoteActions }) {
  const [editing, setEditing] = useState(false);
  const move = useAction((step: () => Promise<unknown>) => step());

  if (editing && actions) {
    return (
      <NoteEditor
        initial={{ title: entry.title, body: entry.body }}
        submitLabel="Save note"
        onSave={async (draft) => {
          await actions.save(draft);
          setEditing(false);
        }}
        onCancel={() => setEditing(false)}
      />
    );
  }

  return (
    <article className="rounded-lg border border-ink/10 bg-paper-raised" aria-label={entry.title || 'Note'}>
      <header className="flex flex-wrap items-center gap-x-3 gap-y-1 border-b border-ink/10 px-5 py-3">
        <span className="rounded bg-accent-soft/70 px-1.5 py-0.5 text-[0.65rem] font-semibold uppercase tracking-wider text-accent-strong">
          Note
        </span>
        {entry.title && <h2 className="min-w-0 flex-1 font-semibold tracking-tight break-words">{entry.title}</h2>}
        <span className="w-full text-xs text-ink-faint sm:ml-auto sm:w-auto">
          {formatDateTime(entry.updatedAt)}
          {entry.updatedBy && ` · ${entry.updatedBy.name}`}
        </span>
      </header>
      <div className="px-5 py-4">
        <MarkdownView source={entry.body} />
      </div>
      {actions && (
        <footer className="flex flex-wrap items-center justify-end gap-1.5 border-t border-ink/10 px-5 py-2">
          <Button size="sm" variant="ghost" onClick={() => setEditing(true)}>
            Edit
          </Button>
          <MoveButton label="Move up" glyph="↑" step={actions.moveUp} busy={move.pending} onMove={move.run} />
          <MoveButton label="Move down" glyph="↓" step={actions.moveDown} busy={move.pending} onMove={move.run} />
          <ConfirmButton label="Delete" question="Delete this note?" confirmLabel="Delete note" onConfirm={actions.remove} />
        </footer>
      )}
      {move.error && (
        <Notice tone="error" className="mx-5 mb-3">
          {move.error}
        </Notice>
      )}
    </article>
  );
}
