'use client';

import { useState } from 'react';
import { sendJson } from '@/lib/api/client';
import type { Entry } from '../api-types';
import { Button } from '../button';
import { EmptyState } from '../empty-state';
import { NoteCard, type NoteActions } from './note-card';
import { NoteEditor } from './note-editor';

interface EntryListProps {
  studyId: string;
  entries: Entry[];
  canEdit: boolean;
  /** Reloads the study after a change. */
  onChanged: () => Promise<unknown>;
}

/** The study's entries in order; editors can add, edit, move and delete Notes. */
export function EntryList({ studyId, entries, canEdit, onChanged }: EntryListProps) {
  const [adding, setAdding] = useState(false);
  const ordered = [...entries].sort((a, b) => a.position - b.position);
  const entryUrl = (entry: Entry) => `/api/studies/${studyId}/entries/${entry.id}`;

  async function change(method: 'PATCH' | 'DELETE', entry: Entry, body?: object) {
    await sendJson(method, entryUrl(entry), body);
    await onChanged();
  }

  function actionsFor(entry: Entry, index: number): NoteActions {
    const before = ordered[index - 1];
    const after = ordered[index + 1];
    return {
      save: (draft) => change('PATCH', entry, draft),
      remove: () => change('DELETE', entry),
      moveUp: before && (() => change('PATCH', entry, { position: before.position })),
      moveDown: after && (() => change('PATCH', entry, { position: after.position })),
    };
  }

  async function addNote(draft: { title: string; body: string }) {
    await sendJson('POST', `/api/studies/${studyId}/entries`, { kind: 'note', ...draft });
    await onChanged();
    setAdding(false);
  }

  const composer = adding ? (
    <NoteEditor submitLabel="Add note" onSave={addNote} onCancel={() => setAdding(false)} />
  ) : (
    canEdit && (
      <Button variant="primary" onClick={() => setAdding(true)}>
        Add note
      </Button>
    )
  );

  if (ordered.length === 0) {
    return adding ? (
      composer
    ) : (
      <EmptyState title="No entries yet" action={composer}>
        {canEdit ? 'Start with a Note: what this study sets out to check, and how.' : 'Nothing has been written here yet.'}
      </EmptyState>
    );
  }

  return (
    <div className="space-y-4">
      <ol className="space-y-4" aria-label="Entries">
        {ordered.map((entry, index) => (
          <li key={entry.id}>
            <NoteCard entry={entry} actions={canEdit ? actionsFor(entry, index) : undefined} />
          </li>
        ))}
      </ol>
      {composer}
    </div>
  );
}
