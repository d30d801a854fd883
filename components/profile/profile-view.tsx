'use client';

import { sendJson } from '@/lib/api/client';
import { PASSWORD_MIN } from '@/models/vocabulary';
import { ActionForm, field, SubmitButton } from '../action-form';
import { TextField } from '../fields';
import { useMe } from '../hooks/use-me';
import { PageHeader } from '../page-header';
import { Panel } from '../panel';
import { SiteRoleBadge } from '../role-badge';

/** The signed-in user's own account: display name and password. */
export function ProfileView() {
  const { me, mutate } = useMe();
  if (!me) return null;

  async function saveName(data: FormData) {
    await sendJson('PATCH', '/api/me', { name: field(data, 'name') });
    await mutate();
  }

  async function changePassword(data: FormData) {
    const newPassword = field(data, 'newPassword', false);
    if (newPassword !== field(data, 'confirmPassword', false)) {
      throw new Error('The two new passwords differ. Type the same password twice.');
    }
    await sendJson('PATCH', '/api/me', { currentPassword: field(data, 'currentPassword', false), newPassword });
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
          <ActionForm onSubmit={changePassword} resetOnSuccess successMessage="Password changed." aria-label="Password">
            <TextField label="Current password" name="currentPassword" type="password" autoComplete="current-password" required />
            <TextField label="New password" name="newPassword" type="password" autoComplete="new-password" minLength={PASSWORD_MIN} required hint={`At least ${PASSWORD_MIN} characters.`} />
            <TextField label="New password again" name="confirmPassword" type="password" autoComplete="new-password" minLength={PASSWORD_MIN} required />
            <SubmitButton>Change password</SubmitButton>
          </ActionForm>
        </Panel>
      </div>
    </>
  );
}
