'use client';

import { useRouter } from 'next/navigation';
import { sendJson } from '@/lib/fetcher';
import { ActionForm, field, SubmitButton } from '../action-form';
import { TextField } from '../fields';
import { signInWithPassword } from './after-sign-in';

export function SignUpForm() {
  const router = useRouter();
  async function submit(data: FormData) {
    const email = field(data, 'email');
    const password = field(data, 'password', false);
    await sendJson('POST', '/api/signup', { name: field(data, 'name'), email, password });
    await signInWithPassword(email, password);
    router.replace('/studies');
    router.refresh();
  }
  return (
    <ActionForm onSubmit={submit} aria-label="Create account">
      <TextField label="Name" name="name" autoComplete="name" required autoFocus />
      <TextField label="Email" name="email" type="email" autoComplete="email" required />
      <TextField
        label="Password"
        name="password"
        type="password"
        autoComplete="new-password"
        minLength={8}
        required
        hint="At least 8 characters."
      />
      <SubmitButton pendingLabel="Creating account…">Create account</SubmitButton>
    </ActionForm>
  );
}
