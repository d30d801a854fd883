'use client';

import { sendJson } from '@/lib/api/client';
import type { AdminUser, SiteRole } from '../api-types';
import { Button } from '../button';
import { inlineSelectClass } from '../fields';
import { formatDate } from '../format';
import { Notice } from '../notice';
import { PersonLabel } from '../person-label';
import { useAction } from '../use-action';

/** Widths shared by the rows and the column captions above them, so the columns line up. */
export const userColumns = {
  status: 'w-24 shrink-0',
  joined: 'hidden w-28 shrink-0 md:block',
  role: 'w-28 shrink-0',
  action: 'w-20 shrink-0 text-right',
};

function AccountStatus({ disabled }: { disabled: boolean }) {
  return (
    <span className={`inline-flex items-center gap-1.5 text-sm ${disabled ? 'text-danger' : 'text-accent-strong'}`}>
      <span aria-hidden className={`h-2 w-2 rounded-full ${disabled ? 'bg-danger' : 'bg-accent'}`} />
      {disabled ? 'Disabled' : 'Active'}
    </span>
  );
}

interface UserRowProps {
  user: AdminUser;
  isMe: boolean;
  onChanged: () => Promise<unknown>;
}

/**
 * One account: its site role and whether it may sign in. On narrow screens the controls wrap under the name. An
 * admin's own row offers neither demotion nor "Disable" (the server refuses both: nobody locks themselves out).
 */
export function UserRow({ user, isMe, onChanged }: UserRowProps) {
  const update = useAction(async (change: { siteRole?: SiteRole; disabled?: boolean }) => {
    await sendJson('PATCH', `/api/admin/users/${user.id}`, change);
    await onChanged();
  });

  return (
    <li aria-label={user.name} className={`px-4 py-3 ${user.disabled ? 'bg-paper-sunk/60' : ''}`}>
      <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
        <PersonLabel name={user.name} email={user.email} isMe={isMe} className="flex-1 basis-56" />
        <div className={userColumns.status}>
          <AccountStatus disabled={user.disabled} />
        </div>
        <div className={`${userColumns.joined} text-sm text-ink-soft`}>{formatDate(user.createdAt)}</div>
        <select
          aria-label={`Site role of ${user.name}`}
          value={user.siteRole}
          disabled={update.pending || isMe}
          title={isMe ? 'Another admin can change your role' : undefined}
          onChange={(event) => update.run({ siteRole: event.target.value as SiteRole })}
          className={`${inlineSelectClass} ${userColumns.role}`}
        >
          <option value="member">Member</option>
          <option value="admin">Admin</option>
        </select>
        <div className={userColumns.action}>
          {isMe ? null : (
          <Button
            size="sm"
            variant={user.disabled ? 'secondary' : 'danger'}
            disabled={update.pending}
            aria-label={`${user.disabled ? 'Enable' : 'Disable'} ${user.name}`}
            onClick={() => update.run({ disabled: !user.disabled })}
          >
            {user.disabled ? 'Enable' : 'Disable'}
          </Button>
          )}
        </div>
      </div>
      {update.error && (
        <Notice tone="error" className="mt-2">
          {update.error}
        </Notice>
      )}
    </li>
  );
}
