'use client';

import { useState } from 'react';
import useSWR from 'swr';
import { sendJson, type ApiError } from '@/lib/api/client';
import type { ApiTokenView as ApiToken } from '@/lib/samples/shapes';
import { API_TOKEN_NAME_MAX } from '@/models/vocabulary';
import { ActionForm, field, SubmitButton } from '../action-form';
import { ConfirmButton } from '../confirm-button';
import { TextField } from '../fields';
import { formatDate, formatDateTime } from '../format';
import { LoadingBlock } from '../loading-block';
import { Notice } from '../notice';
import { Panel } from '../panel';
import { NewTokenSecret } from './new-token-secret';

function TokenRow({ token, onRevoke }: { token: ApiToken; onRevoke: () => Promise<unknown> }) {
  return (
    <li className="flex flex-wrap items-center justify-between gap-2 py-2.5">
      <div className="min-w-0">
        <p className="truncate font-medium text-ink" title={token.name}>
          {token.name} <span className="font-mono text-xs font-normal text-ink-faint">{token.prefix}…</span>
        </p>
        <p className="text-xs text-ink-soft">
          Created {formatDate(token.createdAt)} · {token.lastUsedAt ? `last used ${formatDateTime(token.lastUsedAt)}` : 'never used'}
        </p>
      </div>
      <ConfirmButton label="Revoke" question="Revoke this token?" confirmLabel="Revoke" onConfirm={onRevoke} />
    </li>
  );
}

/** Personal API tokens: for scripts that upload or read samples as this user. */
export function ApiTokensPanel() {
  const { data, error, mutate } = useSWR<{ tokens: ApiToken[] }, ApiError>('/api/tokens');
  const [created, setCreated] = useState<{ name: string; secret: string } | null>(null);

  async function create(form: FormData) {
    const answer = await sendJson<{ token: ApiToken; secret: string }>('POST', '/api/tokens', { name: field(form, 'name') });
    setCreated({ name: answer.token.name, secret: answer.secret });
    await mutate();
  }

  async function revoke(token: ApiToken) {
    await sendJson('DELETE', `/api/tokens/${token.id}`);
    await mutate();
  }

  return (
    <Panel title="API tokens" lead="Scripts send a token instead of signing in, e.g. to upload samples from an analysis job." className="mt-6 max-w-3xl">
      <div className="space-y-4">
        <ActionForm onSubmit={create} resetOnSuccess aria-label="New API token" className="flex flex-col gap-3 sm:flex-row sm:items-end">
          <div className="flex-1">
            <TextField label="Token name" name="name" required maxLength={API_TOKEN_NAME_MAX} placeholder="e.g. nightly upload job" />
          </div>
          <SubmitButton pendingLabel="Creating…">Create token</SubmitButton>
        </ActionForm>
        {created && <NewTokenSecret {...created} onDone={() => setCreated(null)} />}
        {error && <Notice tone="error">{error.message}</Notice>}
        {!data && !error && <LoadingBlock label="Loading tokens…" />}
        {data && data.tokens.length === 0 && <p className="text-sm text-ink-soft">No tokens yet.</p>}
        {data && data.tokens.length > 0 && (
          <ul aria-label="Your API tokens" className="divide-y divide-ink/10">
            {data.tokens.map((token) => (
              <TokenRow key={token.id} token={token} onRevoke={() => revoke(token)} />
            ))}
          </ul>
        )}
      </div>
    </Panel>
  );
}
