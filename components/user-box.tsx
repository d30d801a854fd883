'use client';

import { signOut } from 'next-auth/react';
import { useRouter } from 'next/navigation';
import type { Me } from './api-types';
import { Button } from './button';
import { useForgetData } from './hooks/use-forget-data';
import { SiteRoleBadge } from './role-badge';

export function SignOutButton() {
  const router = useRouter();
  const forgetData = useForgetData();
  async function handleSignOut() {
    await signOut({ redirect: false });
    await forgetData();
    router.replace('/sign-in');
    router.refresh();
  }
  return (
    <Button variant="ghost" size="sm" onClick={handleSignOut}>
      Sign out
    </Button>
  );
}

/** Who is signed in, with the way out. */
export function UserBox({ me }: { me: Me }) {
  return (
    <div className="border-t border-ink/10 pt-3">
      <div className="flex items-center gap-2 px-1">
        <span className="min-w-0 flex-1 truncate text-sm font-medium text-ink" title={me.name}>
          {me.name}
        </span>
        {me.siteRole === 'admin' && <SiteRoleBadge role="admin" />}
      </div>
      <p className="truncate px-1 text-xs text-ink-soft" title={me.email}>
        {me.email}
      </p>
      <div className="mt-2">
        <SignOutButton />
      </div>
    </div>
  );
}
