'use client';

import { sendJson } from '@/lib/fetcher';
import type { AdminUser, SiteRole } from '../api-types';
import { Button } from '../button';
import { inlineSelectClass } from '../fields';
import { formatDate } from '../format';
import { Notice } from '../notice';
import { useAction } from '../use-action';

const cellClass = 'px-3 py-3 align-middle sm:px-4';

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

/** One account: its site role and whether it may sign in. On narrow screens the status moves under the name. */
export function UserRow({ user, isMe, onChanged }: UserRowProps) {
  const update = useAction(async (change: { siteRole?: SiteRole; disabled?: boolean }) => {
    await sendJson('PATCH', `/api/admin/users/${user.id}`, change);
    await onChanged();
  });

  return (
    <>
      <tr className={user.disabled ? 'bg-paper-sunk/60' : ''}>
        <td className={cellClass}>
          <p className="font-medium break-words text-ink">
            {user.name}
            {isMe && <span className="ml-1 font-normal text-ink-faint">(you)</span>}
          </p>
          <p className="text-xs break-all text-ink-soft">{user.email}</p>
          <div className="mt-1 sm:hidden">
            <AccountStatus disabled={user.disabled} />
          </div>
        </td>
        <td className={cellClass}>
          <select
            aria-label={`Site role of ${user.name}`}
            value={user.siteRole}
            disabled={update.pending}
            onChange={(event) => update.run({ siteRole: event.target.value as SiteRole })}
            className={inlineSelectClass}
          >
            <option value="member">Member</option>
            <option value="admin">Admin</option>
          </select>
        </td>
        <td className={`${cellClass} hidden sm:table-cell`}>
          <AccountStatus disabled={user.disabled} />
        </td>
        <td className={`${cellClass} hidden text-sm text-ink-soft md:table-cell`}>{formatDate(user.createdAt)}</td>
        <td className={`${cellClass} text-right`}>
          <Button
            size="sm"
            variant={user.disabled ? 'secondary' : 'danger'}
            disabled={update.pending}
            aria-label={`${user.disabled ? 'Enable' : 'Disable'} ${user.name}`}
            onClick={() => update.run({ disabled: !user.disabled })}
          >
            {user.disabled ? 'Enable' : 'Disable'}
          </Button>
        </td>
      </tr>
      {update.error && (
        <tr>
          <td colSpan={5} className="px-3 pb-3 sm:px-4">
            <Notice tone="error">{update.error}</Notice>
          </td>
        </tr>
      )}
    </>
  );
}
