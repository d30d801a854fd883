import type { Metadata } from 'next';
import Link from 'next/link';
import { AuthCard } from '@/components/auth-card';
import { SignInForm } from '@/components/auth/sign-in-form';

export const metadata: Metadata = { title: 'Sign in' };

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ callbackUrl?: string | string[] }> }) {
  const { callbackUrl } = await searchParams;
  return (
    <AuthCard
      title="Sign in"
      lead="Open your team's studies."
      other={{ question: 'New here?', href: '/sign-up', label: 'Create an account' }}
    >
      <SignInForm callbackUrl={typeof callbackUrl === 'string' ? callbackUrl : undefined} />
      <p className="mt-4 text-sm">
        <Link href="/forgot-password" className="text-accent-strong hover:underline">
          Forgot your password?
        </Link>
      </p>
    </AuthCard>
  );
}
