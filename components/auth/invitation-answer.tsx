'use client';

import { signOut } from 'next-auth/react';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { sendJson } from '@/lib/api/client';
import type { StudyRole } from '@/models/vocabulary';
import { ActionForm, field, SubmitButton } from '../action-form';
import { Button } from '../button';
import { NewPasswordField, TextField } from '../fields';
import { useForgetData } from '../hooks/use-forget-data';
import { Notice } from '../notice';
import { useAction } from '../use-action';
import { signInWithPassword } from './after-sign-in';

export interface InvitationFacts {
  email: string;
  studyTitle: string;
  role: StudyRole;
}

interface InvitationAnswerProps {
  token: string;
  invitation: InvitationFacts;
  /** The e-mail of the signed-in visitor, or null. */
  signedInAs: string | null;
}

/**
 * What a person can do with an invitation link: join at once when signed in with the invited address, sign out
 * first when signed in as someone else, or else create the account of that address (or sign in to it).
 */
export function InvitationAnswer({ token, invitation, signedInAs }: InvitationAnswerProps) {
  const router = useRouter();
  const forgetData = useForgetData();
  const toStudy = async (studyId: number) => {
    await forgetData();
    router.replace(`/studies/${studyId}`);
    router.refresh();
  };
  const accept = useAction(async () => {
    const joined = await sendJson<{ studyId: number }>('POST', '/api/invitations/accept', { token });
    await toStudy(joined.studyId);
  });
  const leave = useAction(async () => {
    await signOut({ redirect: false });
    await forgetData();
    router.refresh();
  });

  if (signedInAs === invitation.email) {
    return (
      <div className="space-y-3">
        <Button variant="primary" onClick={() => accept.run()} disabled={accept.pending}>
          {accept.pending ? 'Joining…' : 'Join the study'}
        </Button>
        {accept.error && <Notice tone="error">{accept.error}</Notice>}
      </div>
    );
  }
  if (signedInAs !== null) {
    return (
      <div className="space-y-3">
        <Notice>
          You are signed in as {signedInAs}; this invitation is for {invitation.email}. Sign out to accept it as that person.
        </Notice>
        <Button onClick={() => leave.run()} disabled={leave.pending}>
          Sign out and continue
        </Button>
        {leave.error && <Notice tone="error">{leave.error}</Notice>}
      </div>
    );
  }

  async function signUp(form: FormData) {
    const password = field(form, 'password', false);
    const joined = await sendJson<{ studyId: number }>('POST', '/api/invitations/signup', { token, name: field(form, 'name'), password });
    await signInWithPassword(invitation.email, password);
    await toStudy(joined.studyId);
  }
  const here = `/invite/${token}`;
  return (
    <div className="space-y-4">
      <ActionForm onSubmit={signUp} aria-label="Create account and join">
        <TextField label="Email" name="email" type="email" value={invitation.email} readOnly hint="The invited address; the account is made with it." />
        <TextField label="Name" name="name" autoComplete="name" required autoFocus />
        <NewPasswordField />
        <SubmitButton pendingLabel="Creating account…">Create account and join</SubmitButton>
      </ActionForm>
      <p className="text-sm text-ink-soft">
        Already have an account with this address?{' '}
        <Link href={`/sign-in?callbackUrl=${encodeURIComponent(here)}`} className="font-medium text-accent-strong hover:underline">
          Sign in to accept
        </Link>
      </p>
    </div>
  );
}
