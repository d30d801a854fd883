'use client';

import { sendJson } from '@/lib/fetcher';
import type { AdminUser, SiteRole } from '../api-types';
import { Button } from '../button';
import { controlClass } from '../fields';
import { formatDate } from '../format';
import { Notice } from '../notice';
import { useAction } from '../use-action';

interface UserRowProps {
  user: AdminUser;
  isMe: boolean;
  onChanged: () => Promise<unknown>;
}

/** One account: its site role and whether it may sign in. */
export function UserRow({ user, isMe, onChanged }: UserRowProps) {
  const update = useAction(async (change: { siteRole?: SiteRole; disabled?: boolean }) => {
    await sendJson('PATCH', `/api/admin/users/${user.id}`, change);
    await onChanged();
  });

  return (
    <tr className={user.disabled ? 'bg-paper-sunk/60 text-ink-soft' : ''}>
      <td className="px-4 py-3 align-top">
        <p className="font-medium text-ink">
          {user.name}
          {isMe && <span className="ml-1 font-normal text-ink-faint">(you)</span>}
        </p>
        <p className="text-xs text-ink-soft">{user.email}</p>
        {update.error && (
          <div className="mt-2">
            <Notice tone="error">{update.error}</Notice>
          </div>
        )}
      </td>
      <td className="px-4 py-3 align-top">
        <select
          aria-label={`Site role of ${user.name}`}
          value={user.siteRole}
          disabled={update.pending}
          onChange={(event) => update.run({ siteRole: event.target.value as SiteRole })}
          className={`${controlClass} h-8 w-auto py-0`}
        >
          <option value="member">Member</option>
          <option value="admin">Admin</option>
        </select>
      </td>
      <td className="px-4 py-3 align-top">
        <span
          className={`inline-flex items-center gap-1.5 text-sm ${user.disabled ? 'text-danger' : 'text-accent-strong'}`}
        >
          <span aria-hidden className={`h-2 w-2 rounded-full ${user.disabled ? 'bg-danger' : 'bg-accent'}`} />
          {user.disabled ? 'Disabled' : 'Active'}
        </span>
      </td>
      <td className="hidden px-4 py-3 align-top text-sm text-ink-soft md:table-cell">{formatDate(user.createdAt)}</td>
      <td className="px-4 py-3 text-right align-top">
        <Button
          size="sm"
          variant={user.disabled ? 'secondary' : 'danger'}
          disabled={update.pending}
          onClick={() => update.run({ disabled: !user.disabled })}
        >
          {user.disabled ? 'Enable' : 'Disable'}
        </Button>
      </td>
    </tr>
  );
}
