import type { Metadata } from 'next';
import { AuthCard } from '@/components/auth-card';
import { InvitationAnswer } from '@/components/auth/invitation-answer';
import { Notice } from '@/components/notice';
import { ApiError } from '@/lib/api/errors';
import { currentUser } from '@/lib/auth/session';
import { usableInvitation, type LoadedInvitation } from '@/lib/invitations/invitations';

export const metadata: Metadata = { title: 'Invitation' };
export const dynamic = 'force-dynamic';

/** The page an invitation mail links to; the link's token is checked here and again when it is used. */
export default async function InvitationPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  let invitation: LoadedInvitation | null = null;
  let problem: string | null = null;
  try {
    invitation = await usableInvitation(token);
  } catch (error) {
    if (!(error instanceof ApiError)) throw error;
    problem = error.message;
  }
  const user = await currentUser();
  const lead = invitation
    ? `${invitation.invitedBy?.name ?? 'An owner'} invites you to the study “${invitation.study.title}” as ${invitation.role}.`
    : 'An invitation to a study.';
  return (
    <AuthCard title="Join a study" lead={lead} other={{ question: 'Not what you expected?', href: '/sign-in', label: 'Go to sign-in' }}>
      {invitation ? (
        <InvitationAnswer
          token={token}
          invitation={{ email: invitation.email, studyTitle: invitation.study.title, role: invitation.role }}
          signedInAs={user?.email ?? null}
        />
      ) : (
        <Notice tone="error">{problem}</Notice>
      )}
    </AuthCard>
  );
}
