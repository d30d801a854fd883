'use client';

import useSWR from 'swr';
import type { ApiError } from '@/lib/api/client';
import type { AdminUser } from '../api-types';
import { EmptyState } from '../empty-state';
import { countOf } from '../format';
import { useMe } from '../hooks/use-me';
import { LoadingBlock } from '../loading-block';
import { Notice } from '../notice';
import { PageHeader } from '../page-header';
import { SignupSetting } from './signup-setting';
import { UserRow, userColumns } from './user-row';

/** Captions over the columns of the wide layout; narrow screens wrap each row and do without them. */
function UserListCaptions() {
  const caption = 'text-xs font-medium uppercase tracking-wider text-ink-soft';
  return (
    <div aria-hidden className={`hidden items-center gap-x-4 border-b border-ink/10 bg-paper-sunk/60 px-4 py-2.5 sm:flex ${caption}`}>
      <span className="flex-1">Account</span>
      <span className={userColumns.status}>Status</span>
      <span className={userColumns.joined}>Joined</span>
      <span className={userColumns.role}>Site role</span>
      <span className={userColumns.action} />
    </div>
  );
}

function UserList({ users, myId, onChanged }: { users: AdminUser[]; myId: number; onChanged: () => Promise<unknown> }) {
  return (
    <div className="overflow-hidden rounded-lg border border-ink/10 bg-paper-raised">
      <UserListCaptions />
      <ul aria-label="Accounts" className="divide-y divide-ink/10">
        {users.map((user) => (
          <UserRow key={user.id} user={user} isMe={user.id === myId} onChanged={onChanged} />
        ))}
      </ul>
    </div>
  );
}

/** Site administration: who has an account, their site role, and whether anyone may sign up. */
export function UsersView() {
  const { me } = useMe();
  const isAdmin = me?.siteRole === 'admin';
  const { data, error, mutate } = useSWR<{ users: AdminUser[] }, ApiError>(isAdmin ? '/api/admin/users' : null);

  if (!me) return null;
  if (!isAdmin) {
    return <EmptyState title="Admins only">This page manages the server&apos;s accounts; your site role is member.</EmptyState>;
  }
  return (
    <>
      <PageHeader title="Users" lead={data ? `${countOf(data.users.length, 'account')} on this server.` : 'Accounts on this server.'} />
      <SignupSetting />
      {error && <Notice tone="error">{error.message}</Notice>}
      {!data && !error && <LoadingBlock label="Loading users…" />}
      {data && <UserList users={data.users} myId={me.id} onChanged={mutate} />}
    </>
  );
}
