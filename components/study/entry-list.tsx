'use client';

import { useState } from 'react';
import { sendJson } from '@/lib/api/client';
import type { Entry } from '../api-types';
import { Button } from '../button';
import { EmptyState } from '../empty-state';
import { NewViewForm } from './new-view-form';
import { NoteCard, type NoteActions } from './note-card';
import { NoteEditor } from './note-editor';
import { ViewCard } from './view-card';

interface EntryListProps {
  studyId: string;
  entries: Entry[];
  canEdit: boolean;
  /** Reloads the study after a change. */
  onChanged: () => Promise<unknown>;
}

type Adding = 'note' | 'map' | 'contrast' | 'separation' | null;

/** The study's entries in order (Notes, Maps, Contrasts, Separations); editors can add, move and delete them, and edit Notes. */
export function EntryList({ studyId, entries, canEdit, onChanged }: EntryListProps) {
  const [adding, setAdding] = useState<Adding>(null);
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
    setAdding(null);
  }

  const composer =
    adding === 'note' ? (
      <NoteEditor submitLabel="Add note" onSave={addNote} onCancel={() => setAdding(null)} />
    ) : adding ? (
      <NewViewForm studyId={studyId} kind={adding} onCancel={() => setAdding(null)} />
    ) : (
      canEdit && (
        <div className="flex flex-wrap gap-2">
          <Button variant="primary" onClick={() => setAdding('note')}>
            Add note
          </Button>
          <Button onClick={() => setAdding('map')}>Add map</Button>
          <Button onClick={() => setAdding('contrast')}>Add contrast</Button>
          <Button onClick={() => setAdding('separation')}>Add separation</Button>
        </div>
      )
    );

  if (ordered.length === 0) {
    return adding ? (
      composer
    ) : (
      <EmptyState title="No entries yet" action={composer}>
        {canEdit ? 'Start with a Note (what this study sets out to check, and how), a Map of a sample, or a Contrast of two.' : 'Nothing has been written here yet.'}
      </EmptyState>
    );
  }

  return (
    <div className="space-y-4">
      <ol className="space-y-4" aria-label="Entries">
        {ordered.map((entry, index) => (
          <li key={entry.id}>
            {entry.kind !== 'note' ? (
              <ViewCard studyId={studyId} entry={entry} actions={canEdit ? actionsFor(entry, index) : undefined} />
            ) : (
              <NoteCard entry={entry} actions={canEdit ? actionsFor(entry, index) : undefined} />
            )}
          </li>
        ))}
      </ol>
      {composer}
    </div>
  );
}
