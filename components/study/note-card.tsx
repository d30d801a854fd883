'use client';

import { useState } from 'react';
import type { Entry } from '../api-types';
import { Button } from '../button';
import { formatDateTime } from '../format';
import { MarkdownView } from '../markdown-view';
import { EntryActionButtons, type EntryActions } from './entry-actions';
import { NoteEditor, type NoteDraft } from './note-editor';

export interface NoteActions extends EntryActions {
  save: (draft: NoteDraft) => Promise<unknown>;
}

/** One Note entry: its rendered Markdown, and for editors the controls to edit, move and delete it. */
export function NoteCard({ entry, actions }: { entry: Entry; actions?: NoteActions }) {
  const [editing, setEditing] = useState(false);

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
        <EntryActionButtons actions={actions} what="note">
          <Button size="sm" variant="ghost" onClick={() => setEditing(true)}>
            Edit
          </Button>
        </EntryActionButtons>
      )}
    </article>
  );
}
