import type { Metadata } from 'next';
import { AuthCard } from '@/components/auth-card';
import { SignUpForm } from '@/components/auth/sign-up-form';

export const metadata: Metadata = { title: 'Create an account' };

export default function SignUpPage() {
  return (
    <AuthCard
      title="Create an account"
      lead="Join your team's Splitfield server."
      other={{ question: 'Already have an account?', href: '/sign-in', label: 'Sign in' }}
    >
      <SignUpForm />
    </AuthCard>
  );
}
