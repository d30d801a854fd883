import Link from 'next/link';
import type { ReactNode } from 'react';
import { BrandMark } from './brand-mark';

interface AuthCardProps {
  title: string;
  lead: string;
  /** The link to the other page of the pair (sign in ⇄ create an account). */
  other: { question: string; href: string; label: string };
  children: ReactNode;
}

/** The centred card of the sign-in and sign-up pages. */
export function AuthCard({ title, lead, other, children }: AuthCardProps) {
  return (
    <main className="flex min-h-screen flex-col items-center justify-center px-4 py-10">
      <div className="w-full max-w-sm">
        <div className="mb-6 flex justify-center">
          <BrandMark href="/sign-in" />
        </div>
        <div className="rounded-xl border border-ink/10 bg-paper-raised p-6 shadow-sm sm:p-8">
          <h1 className="text-xl font-semibold tracking-tight">{title}</h1>
          <p className="mt-1 mb-6 text-sm text-ink-soft">{lead}</p>
          {children}
        </div>
        <p className="mt-6 text-center text-sm text-ink-soft">
          {other.question}{' '}
          <Link href={other.href} className="font-medium text-accent-strong hover:underline">
            {other.label}
          </Link>
        </p>
      </div>
    </main>
  );
}
