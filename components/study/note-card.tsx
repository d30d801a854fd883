'use client';

import { useState } from 'react';
import type { Entry } from '../api-types';
import { Button } from '../button';
import { MarkdownView } from '../markdown-view';
import { EntryActionButtons, EntryHeader, type EntryActions } from './entry-card-parts';
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
      <EntryHeader entry={entry} kind="note" />
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
