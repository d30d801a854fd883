'use client';

import { sendJson } from '@/lib/api/client';
import { ActionForm, SubmitOrCancel } from '../action-form';
import { readStudyFields, StudyFields } from '../studies/study-fields';

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
    await sendJson('PATCH', `/api/studies/${studyId}`, readStudyFields(data));
    await onSaved();
  }
  return (
    <ActionForm onSubmit={submit} aria-label="Study details" className="space-y-3 rounded-lg border border-accent/40 bg-paper-raised p-4">
      <StudyFields title={title} description={description ?? ''} />
      <SubmitOrCancel label="Save" onCancel={onCancel} />
    </ActionForm>
  );
}
