'use client';

import useSWR from 'swr';
import { sendJson, type ApiError } from '@/lib/api/client';
import { INVITATION_DAYS } from '@/models/vocabulary';
import { ActionForm, field, SubmitButton } from '../action-form';
import type { PendingInvitation } from '../api-types';
import { ConfirmButton } from '../confirm-button';
import { formatDate } from '../format';
import { Notice } from '../notice';
import { RoleBadge } from '../role-badge';
import { EmailRoleFields } from './email-role-fields';

/** Owners invite by e-mail (a mail with a link; the person may have no account yet) and revoke what is pending. */
export function Invitations({ studyId }: { studyId: string }) {
  const url = `/api/studies/${studyId}/invitations`;
  const { data, error, mutate } = useSWR<{ invitations: PendingInvitation[] }, ApiError>(url);

  async function invite(form: FormData) {
    await sendJson('POST', url, { email: field(form, 'email'), role: field(form, 'role') });
    await mutate();
  }

  return (
    <div className="space-y-3">
      <h3 className="text-sm font-semibold">Invite by e-mail</h3>
      <ActionForm onSubmit={invite} resetOnSuccess successMessage="Invitation mailed." aria-label="Invite by e-mail" className="space-y-3">
        <EmailRoleFields emailHint={`They get a link that works once, for ${INVITATION_DAYS} days; no account is needed yet.`} />
        <SubmitButton size="sm" pendingLabel="Inviting…">
          Send invitation
        </SubmitButton>
      </ActionForm>
      {error && <Notice tone="error">{error.message}</Notice>}
      {data && data.invitations.length > 0 && (
        <>
          <h4 className="pt-1 text-xs font-medium uppercase tracking-wider text-ink-faint">Pending invitations</h4>
          <ul aria-label="Pending invitations" className="divide-y divide-ink/10 border-t border-ink/10">
            {data.invitations.map((invitation) => (
              <li key={invitation.id} className="space-y-1.5 py-2.5 text-sm">
                <p className="truncate font-medium" title={invitation.email}>
                  {invitation.email}
                </p>
                <p className="text-xs text-ink-soft">
                  {invitation.expired ? 'Expired' : `Pending until ${formatDate(invitation.expiresAt)}`}
                  {invitation.invitedBy && ` · invited by ${invitation.invitedBy.name}`}
                </p>
                <div className="flex flex-wrap items-center gap-2">
                  <RoleBadge role={invitation.role} />
                  <ConfirmButton
                    label="Revoke"
                    question={`Revoke the invitation of ${invitation.email}?`}
                    confirmLabel="Revoke"
                    onConfirm={async () => {
                      await sendJson('DELETE', `${url}/${invitation.id}`);
                      await mutate();
                    }}
                  />
                </div>
              </li>
            ))}
          </ul>
        </>
      )}
    </div>
  );
}
