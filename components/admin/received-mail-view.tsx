'use client';

import Link from 'next/link';
import type { ReactNode } from 'react';
import useSWR from 'swr';
import type { ApiError } from '@/lib/api/client';
import { formatDateTime } from '../format';
import { LoadingBlock } from '../loading-block';
import { Notice } from '../notice';
import { PageHeader } from '../page-header';
import { Panel } from '../panel';
import type { ReceivedMailDetail } from './outbox-types';

const URL_IN_TEXT = /(https?:\/\/[^\s<>"]+)/g;

/** Plain text with its web addresses as links (built as elements, never as HTML). */
function TextWithLinks({ text }: { text: string }): ReactNode {
  return text.split(URL_IN_TEXT).map((part, index) =>
    index % 2 === 1 ? (
      <a key={index} href={part} className="text-accent-strong underline" rel="noopener noreferrer">
        {part}
      </a>
    ) : (
      part
    ),
  );
}

/** One message the local mail server received: its HTML part (sanitised on the server) and its text part. */
export function ReceivedMailView({ mailId }: { mailId: string }) {
  const { data, error } = useSWR<{ mail: ReceivedMailDetail }, ApiError>(`/api/admin/mail/${encodeURIComponent(mailId)}`);
  if (error) return <Notice tone="error">{error.message}</Notice>;
  if (!data) return <LoadingBlock label="Loading mail…" />;
  const { mail } = data;
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href="/admin/mail" className="text-accent-strong hover:underline">
          ← Outbox
        </Link>
      </p>
      <PageHeader
        title={mail.subject}
        lead={`From ${mail.from} to ${mail.to.join(', ')} · ${formatDateTime(mail.receivedAt)} · ${mail.size} bytes`}
      />
      <div className="grid items-start gap-6 lg:grid-cols-2">
        <Panel title="HTML part" lead="Shown sanitised: formatting and links only.">
          {mail.html === null ? (
            <p className="text-sm text-ink-soft">This message has no HTML part.</p>
          ) : (
            <div
              data-testid="mail-html"
              className="space-y-3 text-sm [&_a]:text-accent-strong [&_a]:underline [&_hr]:border-ink/10 [&_li]:ml-5 [&_li]:list-disc"
              dangerouslySetInnerHTML={{ __html: mail.html }}
            />
          )}
        </Panel>
        <Panel title="Text part">
          <pre data-testid="mail-text" className="whitespace-pre-wrap break-words font-mono text-xs leading-relaxed">
            <TextWithLinks text={mail.text} />
          </pre>
        </Panel>
      </div>
    </>
  );
}
