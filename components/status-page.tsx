import type { ReactNode } from 'react';
import { BrandMark } from './brand-mark';

/** A whole page that only tells the visitor something (not found, failed), with a way on. */
export function StatusPage({ title, children }: { title: string; children: ReactNode }) {
  return (
    <main className="mx-auto flex min-h-screen max-w-md flex-col justify-center gap-4 px-4">
      <BrandMark />
      <h1 className="text-2xl font-semibold tracking-tight">{title}</h1>
      {children}
    </main>
  );
}
