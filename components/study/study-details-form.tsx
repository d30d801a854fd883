'use client';

import { sendJson } from '@/lib/fetcher';
import { ActionForm, field, SubmitButton } from '../action-form';
import { Button } from '../button';
import { TextArea, TextField } from '../fields';

interface StudyDetailsFormProps {
  studyId: string;
  title: string;
  description: string | null;
  onSaved: () => Promise<unknown>;
  onCancel: () => void;
}

/** Renames a study and edits its description. */
export function StudyDetailsForm({ studyId, title, description, onSaved, onCancel }: StudyDetailsFormProps) {
  async function submit(data: FormData) {
    await sendJson('PATCH', `/api/studies/${studyId}`, { title: field(data, 'title'), description: field(data, 'description') });
    await onSaved();
  }
  return (
    <ActionForm onSubmit={submit} aria-label="Study details" className="space-y-3 rounded-lg border border-accent/40 bg-paper-raised p-4">
      <TextField label="Title" name="title" defaultValue={title} required maxLength={200} autoFocus />
      <TextArea label="Description" name="description" defaultValue={description ?? ''} rows={2} />
      <div className="flex gap-2">
        <SubmitButton>Save</SubmitButton>
        <Button variant="ghost" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </ActionForm>
  );
}
