import type { ReactNode } from 'react';
import { headers } from 'next/headers';
import { AppShell } from '@/components/app-shell';
import { requireVisiblePage } from '@/lib/auth/page-access';
import { PATHNAME_HEADER } from '@/lib/auth/paths';

export default async function SignedInLayout({ children }: { children: ReactNode }) {
  // An unknown study or sample answers 404 before the frame is sent.
  await requireVisiblePage((await headers()).get(PATHNAME_HEADER) ?? '');
  return <AppShell>{children}</AppShell>;
}
