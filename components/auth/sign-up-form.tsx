'use client';

import { useRouter } from 'next/navigation';
import useSWR from 'swr';
import { sendJson, type ApiError } from '@/lib/api/client';
import { ActionForm, field, SubmitButton } from '../action-form';
import { NewPasswordField, TextField } from '../fields';
import { useForgetData } from '../hooks/use-forget-data';
import { LoadingBlock } from '../loading-block';
import { Notice } from '../notice';
import { signInWithPassword } from './after-sign-in';

/** Creates an account and signs in with it; says so at once when this server does not take sign-ups. */
export function SignUpForm() {
  const router = useRouter();
  const forgetData = useForgetData();
  const { data, error } = useSWR<{ openSignup: boolean }, ApiError>('/api/signup');

  async function submit(form: FormData) {
    const email = field(form, 'email');
    const password = field(form, 'password', false);
    await sendJson('POST', '/api/signup', { name: field(form, 'name'), email, password });
    await signInWithPassword(email, password);
    await forgetData();
    router.replace('/studies');
    router.refresh();
  }

  if (error) return <Notice tone="error">{error.message}</Notice>;
  if (!data) return <LoadingBlock />;
  if (!data.openSignup) {
    return <Notice>Sign-up is closed on this server. Ask one of its admins to open it.</Notice>;
  }
  return (
    <ActionForm onSubmit={submit} aria-label="Create account">
      <TextField label="Name" name="name" autoComplete="name" required autoFocus />
      <TextField label="Email" name="email" type="email" autoComplete="email" required />
      <NewPasswordField />
      <SubmitButton pendingLabel="Creating account…">Create account</SubmitButton>
    </ActionForm>
  );
}
