'use client';

import { useEffect, useRef, useState, type ReactNode } from 'react';
import { usePathname, useRouter } from 'next/navigation';
import { BrandMark } from './brand-mark';
import { Button } from './button';
import { useMe } from './hooks/use-me';
import { LoadingBlock } from './loading-block';
import { NavLinks } from './nav-links';
import { Notice } from './notice';
import { SignOutButton, UserBox } from './user-box';
import type { Me } from './api-types';

/** Narrow screens: a top bar whose menu button opens the navigation below it. */
function TopBar({ me }: { me: Me }) {
  const [open, setOpen] = useState(false);
  const toggle = useRef<HTMLButtonElement>(null);
  // Escape closes the open menu and gives the focus back to its button.
  useEffect(() => {
    if (!open) return;
    const onKey = (event: KeyboardEvent) => {
      if (event.key !== 'Escape') return;
      setOpen(false);
      toggle.current?.focus();
    };
    document.addEventListener('keydown', onKey);
    return () => document.removeEventListener('keydown', onKey);
  }, [open]);
  return (
    <div className="sticky top-0 z-20 border-b border-ink/10 bg-paper-raised md:hidden">
      <div className="flex h-14 items-center justify-between px-4">
        <BrandMark />
        <Button ref={toggle} variant="ghost" size="sm" aria-expanded={open} aria-controls="top-menu" onClick={() => setOpen(!open)}>
          {open ? 'Close' : 'Menu'}
        </Button>
      </div>
      {open && (
        <div id="top-menu" className="space-y-3 border-t border-ink/10 px-3 pb-3 pt-2">
          <NavLinks me={me} onNavigate={() => setOpen(false)} />
          <UserBox me={me} />
        </div>
      )}
    </div>
  );
}

/** Wide screens: a column on the left whose contents stay in view while the page scrolls. */
function SideBar({ me }: { me: Me }) {
  return (
    <div className="hidden w-60 shrink-0 border-r border-ink/10 bg-paper-raised md:block">
      <aside className="sticky top-0 flex h-screen flex-col px-3 py-5">
        <div className="px-2 pb-6">
          <BrandMark />
        </div>
        <div className="flex-1">
          <NavLinks me={me} />
        </div>
        <UserBox me={me} />
      </aside>
    </div>
  );
}

/** The frame of every signed-in page. Sends visitors without a session to the sign-in page. */
export function AppShell({ children }: { children: ReactNode }) {
  const { me, error } = useMe();
  const router = useRouter();
  const pathname = usePathname();
  const signedOut = error?.status === 401;

  useEffect(() => {
    if (signedOut) router.replace(`/sign-in?callbackUrl=${encodeURIComponent(pathname)}`);
  }, [signedOut, pathname, router]);

  if (error && !signedOut) {
    return (
      <main className="mx-auto max-w-md space-y-4 px-4 py-16">
        <BrandMark />
        <Notice tone="error">{error.message}</Notice>
        <SignOutButton />
      </main>
    );
  }
  if (!me) {
    return (
      <main className="mx-auto max-w-md px-4 py-16">
        <LoadingBlock label={signedOut ? 'Taking you to sign in…' : 'Loading…'} />
      </main>
    );
  }
  return (
    <div className="min-h-screen md:flex">
      <SideBar me={me} />
      <TopBar me={me} />
      <main className="min-w-0 flex-1 px-4 py-6 sm:px-6 md:px-10 md:py-10">
        <div className="mx-auto max-w-5xl">{children}</div>
      </main>
    </div>
  );
}
