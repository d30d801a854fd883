'use client';

import { useState } from 'react';
import { Button } from '../button';

/** A token's secret, shown once right after it was made, with a copy button and the warning that goes with it. */
export function NewTokenSecret({ name, secret, onDone }: { name: string; secret: string; onDone: () => void }) {
  const [copied, setCopied] = useState<'yes' | 'failed' | null>(null);

  async function copy() {
    try {
      await navigator.clipboard.writeText(secret);
      setCopied('yes');
    } catch {
      setCopied('failed');
    }
  }

  return (
    <div role="status" className="space-y-3 rounded-md border border-warn/30 bg-warn-soft p-3 text-sm">
      <p className="font-medium text-ink">Token “{name}” created. Copy its secret now: it is not shown again.</p>
      <div className="flex flex-wrap items-center gap-2">
        <code aria-label="Token secret" className="min-w-0 flex-1 break-all rounded bg-paper-raised px-2 py-1.5 font-mono text-xs text-ink select-all">
          {secret}
        </code>
        <Button size="sm" onClick={copy}>
          {copied === 'yes' ? 'Copied' : 'Copy'}
        </Button>
      </div>
      {copied === 'failed' && <p className="text-xs text-danger">The browser refused to copy; select the secret and copy it by hand.</p>}
      <p className="text-xs text-ink-soft">
        Send it as <code className="font-mono">Authorization: Bearer &lt;secret&gt;</code>. Anyone holding it acts as you: keep it
        out of shared notebooks and repositories.
      </p>
      <Button variant="ghost" size="sm" onClick={onDone}>
        I have stored it
      </Button>
    </div>
  );
}
