'use client';

import { useRouter } from 'next/navigation';
import { ActionForm, field, SubmitButton } from '../action-form';
import { TextField } from '../fields';
import { useForgetData } from '../hooks/use-forget-data';
import { safeReturnPath, signInWithPassword } from './after-sign-in';

export function SignInForm({ callbackUrl }: { callbackUrl?: string }) {
  const router = useRouter();
  const forgetData = useForgetData();
  async function submit(data: FormData) {
    await signInWithPassword(field(data, 'email'), field(data, 'password', false));
    await forgetData();
    router.replace(safeReturnPath(callbackUrl));
    router.refresh();
  }
  return (
    <ActionForm onSubmit={submit} aria-label="Sign in">
      <TextField label="Email" name="email" type="email" autoComplete="email" required autoFocus />
      <TextField label="Password" name="password" type="password" autoComplete="current-password" required />
      <SubmitButton pendingLabel="Signing in…">Sign in</SubmitButton>
    </ActionForm>
  );
}
