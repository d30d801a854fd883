'use client';

import useSWR from 'swr';
import type { ApiError } from '@/lib/fetcher';
import type { AdminUser } from '../api-types';
import { EmptyState } from '../empty-state';
import { countOf } from '../format';
import { useMe } from '../hooks/use-me';
import { LoadingBlock } from '../loading-block';
import { Notice } from '../notice';
import { PageHeader } from '../page-header';
import { SignupSetting } from './signup-setting';
import { UserRow } from './user-row';

const headCell = 'px-3 py-2.5 text-left text-xs font-medium uppercase tracking-wider text-ink-soft sm:px-4';

function UserTable({ users, myId, onChanged }: { users: AdminUser[]; myId: number; onChanged: () => Promise<unknown> }) {
  return (
    <div className="relative overflow-x-auto rounded-lg border border-ink/10 bg-paper-raised">
      <table className="w-full divide-y divide-ink/10">
        <thead className="bg-paper-sunk/60">
          <tr>
            <th className={headCell}>User</th>
            <th className={headCell}>Site role</th>
            <th className={`${headCell} hidden sm:table-cell`}>Status</th>
            <th className={`${headCell} hidden md:table-cell`}>Joined</th>
            <th className={headCell}>
              <span className="sr-only">Actions</span>
            </th>
          </tr>
        </thead>
        <tbody className="divide-y divide-ink/10">
          {users.map((user) => (
            <UserRow key={user.id} user={user} isMe={user.id === myId} onChanged={onChanged} />
          ))}
        </tbody>
      </table>
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
      {data && <UserTable users={data.users} myId={me.id} onChanged={mutate} />}
    </>
  );
}
