'use client';

import { signOut } from 'next-auth/react';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { sendJson } from '@/lib/api/client';
import { PASSWORD_MIN } from '@/models/vocabulary';
import { ActionForm, field, SubmitButton } from '../action-form';
import { ConfirmButton } from '../confirm-button';
import { useForgetData } from '../hooks/use-forget-data';
import { Notice } from '../notice';
import { NewPasswordField, TextField } from '../fields';
import { useMe } from '../hooks/use-me';
import { PageHeader } from '../page-header';
import { Panel } from '../panel';
import { SiteRoleBadge } from '../role-badge';

interface PasswordChangeAnswer {
  endedSessions: number;
  revokedTokens: number;
}

const count = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** What a password change ended, in words. */
function passwordChangeNote({ endedSessions, revokedTokens }: PasswordChangeAnswer, keptTokens: boolean): string {
  const sessions = `${count(endedSessions, 'other session was', 'other sessions were')} signed out`;
  const tokens = keptTokens ? 'your API tokens were kept' : `${count(revokedTokens, 'API token was', 'API tokens were')} revoked`;
  return `Password changed: ${sessions}, and ${tokens}.`;
}

/** The signed-in user's own account: display name, password, and the way to end every session. */
export function ProfileView() {
  const { me, mutate } = useMe();
  const router = useRouter();
  const forgetData = useForgetData();
  const [passwordNote, setPasswordNote] = useState<string | null>(null);
  if (!me) return null;

  async function signOutEverywhere() {
    await sendJson('DELETE', '/api/me/sessions');
    await signOut({ redirect: false });
    await forgetData();
    router.replace('/sign-in');
    router.refresh();
  }

  async function saveName(data: FormData) {
    await sendJson('PATCH', '/api/me', { name: field(data, 'name') });
    await mutate();
  }

  async function changePassword(data: FormData) {
    const newPassword = field(data, 'newPassword', false);
    if (newPassword !== field(data, 'confirmPassword', false)) {
      throw new Error('The two new passwords differ. Type the same password twice.');
    }
    setPasswordNote(null);
    const keepApiTokens = data.get('keepApiTokens') === 'on';
    const answer = await sendJson<PasswordChangeAnswer>('PATCH', '/api/me', {
      currentPassword: field(data, 'currentPassword', false),
      newPassword,
      keepApiTokens,
    });
    setPasswordNote(passwordChangeNote(answer, keepApiTokens));
  }

  return (
    <>
      <PageHeader
        title="Profile"
        lead={
          <span className="inline-flex flex-wrap items-center gap-2">
            {me.email} <SiteRoleBadge role={me.siteRole} />
          </span>
        }
      />
      <div className="grid max-w-3xl items-start gap-6 md:grid-cols-2">
        <Panel title="Name">
          <ActionForm onSubmit={saveName} successMessage="Name saved." aria-label="Name">
            <TextField label="Display name" name="name" defaultValue={me.name} required autoComplete="name" hint="Shown to the members of your studies." />
            <SubmitButton>Save name</SubmitButton>
          </ActionForm>
        </Panel>
        <Panel title="Password">
          <ActionForm onSubmit={changePassword} resetOnSuccess aria-label="Password">
            <p className="text-xs text-ink-soft">
              A new password signs out every other session of yours at once. Your API tokens are revoked too, unless you
              keep them.
            </p>
            <TextField label="Current password" name="currentPassword" type="password" autoComplete="current-password" required />
            <NewPasswordField label="New password" name="newPassword" />
            <TextField label="New password again" name="confirmPassword" type="password" autoComplete="new-password" minLength={PASSWORD_MIN} required />
            <label className="flex items-start gap-2 text-sm text-ink">
              <input type="checkbox" name="keepApiTokens" className="mt-0.5 h-4 w-4 accent-accent" />
              <span>Keep my API tokens working</span>
            </label>
            <SubmitButton>Change password</SubmitButton>
          </ActionForm>
          {passwordNote && (
            <Notice tone="success" className="mt-3">
              {passwordNote}
            </Notice>
          )}
        </Panel>
        <Panel title="Sessions">
          <div className="space-y-3">
            <p className="text-sm text-ink-soft">
              Signed in on another computer, or left a session open somewhere? End every session of yours, this one
              included; you sign in again here. API tokens keep working.
            </p>
            <ConfirmButton
              label="Sign out everywhere"
              question="End every session of yours, this one too?"
              confirmLabel="Sign out everywhere"
              onConfirm={signOutEverywhere}
            />
          </div>
        </Panel>
      </div>
    </>
  );
}
