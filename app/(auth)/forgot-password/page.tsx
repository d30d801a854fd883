import type { Metadata } from 'next';
import { AuthCard } from '@/components/auth-card';
import { ForgotPasswordForm } from '@/components/auth/password-reset-forms';

export const metadata: Metadata = { title: 'Forgot password' };

export default function ForgotPasswordPage() {
  return (
    <AuthCard
      title="Forgot your password?"
      lead="We mail a link to choose a new one. It works once, within the hour."
      other={{ question: 'Remembered it?', href: '/sign-in', label: 'Sign in' }}
    >
      <ForgotPasswordForm />
    </AuthCard>
  );
}
