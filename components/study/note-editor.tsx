'use client';

import { useId, useState } from 'react';
import { ENTRY_TITLE_MAX, NOTE_BODY_MAX } from '@/models/vocabulary';
import { ActionForm, field, SubmitOrCancel } from '../action-form';
import { Button } from '../button';
import { controlClass, TextField } from '../fields';
import { MarkdownView } from '../markdown-view';

export interface NoteDraft {
  title: string;
  body: string;
}

interface NoteEditorProps {
  initial?: NoteDraft;
  submitLabel: string;
  onSave: (draft: NoteDraft) => Promise<unknown>;
  onCancel: () => void;
}

/** Writes a Note: an optional title and a Markdown body, with a preview of how it will read. */
export function NoteEditor({ initial = { title: '', body: '' }, submitLabel, onSave, onCancel }: NoteEditorProps) {
  const [body, setBody] = useState(initial.body);
  const [preview, setPreview] = useState(false);
  const bodyId = useId();

  return (
    <ActionForm
      aria-label={submitLabel}
      onSubmit={(data) => onSave({ title: field(data, 'title'), body })}
      className="space-y-3 rounded-lg border border-accent/40 bg-paper-raised p-4 shadow-sm"
    >
      <TextField label="Title" name="title" defaultValue={initial.title} maxLength={ENTRY_TITLE_MAX} placeholder="Optional" />
      <div className="space-y-1.5">
        <div className="flex items-center justify-between">
          <label htmlFor={bodyId} className="text-sm font-medium">
            Text
          </label>
          <Button variant="ghost" size="sm" aria-pressed={preview} onClick={() => setPreview(!preview)}>
            {preview ? 'Back to writing' : 'Preview'}
          </Button>
        </div>
        {preview ? (
          <div className="min-h-32 rounded-md border border-ink/10 bg-paper px-3 py-2">
            {body.trim() ? <MarkdownView source={body} /> : <p className="text-sm text-ink-faint">Nothing to preview yet.</p>}
          </div>
        ) : (
          <textarea
            id={bodyId}
            name="body"
            value={body}
            onChange={(event) => setBody(event.target.value)}
            rows={8}
            maxLength={NOTE_BODY_MAX}
            required
            className={`${controlClass} font-mono`}
            placeholder={'## Observations\nWrite in Markdown: headings, lists, links, tables, `code`.'}
          />
        )}
        <p className="text-xs text-ink-soft">Markdown, with maths between $…$ (inline) or $$…$$ (displayed). HTML tags are shown as text, never run.</p>
      </div>
      <SubmitOrCancel label={submitLabel} onCancel={onCancel} />
    </ActionForm>
  );
}
