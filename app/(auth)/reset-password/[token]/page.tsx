import type { Metadata } from 'next';
import { AuthCard } from '@/components/auth-card';
import { NewPasswordForm } from '@/components/auth/password-reset-forms';
import { Notice } from '@/components/notice';
import { resetLinkProblem } from '@/lib/auth/password-reset';

export const metadata: Metadata = { title: 'Choose a new password' };
export const dynamic = 'force-dynamic';

/** The page a reset mail links to; the link is checked here and again when the new password is sent. */
export default async function ResetPasswordPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const problem = await resetLinkProblem(token);
  return (
    <AuthCard
      title="Choose a new password"
      lead="Setting it signs the account out everywhere."
      other={{ question: 'Need a new link?', href: '/forgot-password', label: 'Ask again' }}
    >
      {problem ? <Notice tone="error">{problem}</Notice> : <NewPasswordForm token={token} />}
    </AuthCard>
  );
}
