'use client';

import Link from 'next/link';
import { useState } from 'react';
import { sendJson } from '@/lib/api/client';
import { ActionForm, field, SubmitButton } from '../action-form';
import { NewPasswordField, TextField } from '../fields';
import { Notice } from '../notice';

/** Asks for a reset mail; the answer is the same whether or not an account has the address. */
export function ForgotPasswordForm() {
  const [answer, setAnswer] = useState<string | null>(null);
  async function submit(form: FormData) {
    const sent = await sendJson<{ message: string }>('POST', '/api/password-reset', { email: field(form, 'email') });
    setAnswer(sent.message);
  }
  return (
    <ActionForm onSubmit={submit} aria-label="Reset password">
      <TextField label="Email" name="email" type="email" autoComplete="email" required autoFocus />
      <SubmitButton pendingLabel="Sending…">Mail me a reset link</SubmitButton>
      {answer && <Notice tone="success">{answer}</Notice>}
    </ActionForm>
  );
}

/** Sets a new password through the link of a reset mail. */
export function NewPasswordForm({ token }: { token: string }) {
  const [done, setDone] = useState(false);
  async function submit(form: FormData) {
    const password = field(form, 'password', false);
    if (password !== field(form, 'confirmPassword', false)) throw new Error('The two passwords differ. Type the same password twice.');
    await sendJson('POST', '/api/password-reset/complete', { token, password });
    setDone(true);
  }
  if (done) {
    return (
      <Notice tone="success">
        Password changed; every session of the account was signed out and its API tokens revoked.{' '}
        <Link href="/sign-in" className="font-medium underline">
          Sign in
        </Link>{' '}
        with the new password.
      </Notice>
    );
  }
  return (
    <ActionForm onSubmit={submit} aria-label="Choose a new password">
      <NewPasswordField label="New password" autoFocus />
      <TextField label="New password again" name="confirmPassword" type="password" autoComplete="new-password" required />
      <SubmitButton pendingLabel="Saving…">Set new password</SubmitButton>
    </ActionForm>
  );
}
