'use client';

import { sendJson } from '@/lib/api/client';
import { ActionForm, field, SubmitButton } from '../action-form';
import { EmailRoleFields } from './email-role-fields';

/** Owners add a collaborator by the e-mail of their account. */
export function AddMemberForm({ studyId, onAdded }: { studyId: string; onAdded: () => Promise<unknown> }) {
  async function submit(data: FormData) {
    await sendJson('POST', `/api/studies/${studyId}/members`, { email: field(data, 'email'), role: field(data, 'role') });
    await onAdded();
  }
  return (
    <ActionForm onSubmit={submit} resetOnSuccess successMessage="Member added." aria-label="Add member" className="space-y-3">
      <EmailRoleFields />
      <SubmitButton size="sm" pendingLabel="Adding…">
        Add member
      </SubmitButton>
    </ActionForm>
  );
}
