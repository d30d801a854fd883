'use client';

import Link from 'next/link';
import useSWR from 'swr';
import type { ApiError } from '@/lib/api/client';
import { EmptyState } from '../empty-state';
import { formatDateTime } from '../format';
import { useMe } from '../hooks/use-me';
import { LoadingBlock } from '../loading-block';
import { Notice } from '../notice';
import { PageHeader } from '../page-header';
import { Panel } from '../panel';
import { pill } from '../role-badge';
import type { MailerStatus, OutgoingMailRow, ReceivedMailRow } from './outbox-types';

interface Outbox {
  mailer: MailerStatus | null;
  queue: OutgoingMailRow[];
  received: ReceivedMailRow[];
}

const stateStyle: Record<OutgoingMailRow['state'], string> = {
  queued: 'bg-warn-soft text-warn border-warn/30',
  sent: 'bg-accent-soft text-accent-strong border-accent/30',
  failed: 'bg-danger/10 text-danger border-danger/30',
};

function mailerLine(mailer: MailerStatus | null): string {
  if (!mailer) return 'The mailer is not running in this server process.';
  if (mailer.mode === 'smtp') return `Mail goes to the SMTP server ${mailer.server}.`;
  if (mailer.server) return `No SMTP server is configured: mail goes to the local mail server at ${mailer.server} and is shown below.`;
  return mailer.problem ?? 'The local mail server is not running.';
}

function QueueRow({ mail }: { mail: OutgoingMailRow }) {
  const when =
    mail.state === 'sent' && mail.sentAt
      ? `sent ${formatDateTime(mail.sentAt)}`
      : mail.state === 'queued' && mail.nextAttemptAt
        ? `${mail.attempts === 0 ? 'sending' : 'next try'} ${formatDateTime(mail.nextAttemptAt)}`
        : `gave up after ${mail.attempts} attempts`;
  return (
    <li className="space-y-1 py-2.5 text-sm" data-state={mail.state}>
      <div className="flex flex-wrap items-center gap-2">
        <span className={`${pill} ${stateStyle[mail.state]}`}>{mail.state}</span>
        <span className="min-w-0 flex-1 truncate font-medium" title={mail.subject}>
          {mail.subject}
        </span>
      </div>
      <p className="text-xs text-ink-soft">
        {mail.purpose} to {mail.to} · queued {formatDateTime(mail.createdAt)} · {mail.attempts} {mail.attempts === 1 ? 'attempt' : 'attempts'} · {when}
      </p>
      {mail.lastError && <p className="text-xs text-danger">Last error: {mail.lastError}</p>}
    </li>
  );
}

/** The admins' view of mail: where it goes, the outgoing queue with its failures, and the local server's messages. */
export function OutboxView() {
  const { me } = useMe();
  const isAdmin = me?.siteRole === 'admin';
  const { data, error } = useSWR<Outbox, ApiError>(isAdmin ? '/api/admin/mail' : null, { refreshInterval: 3000 });
  if (!me) return null;
  if (!isAdmin) return <EmptyState title="Admins only">The Outbox shows the server&apos;s mail; your site role is member.</EmptyState>;
  const failed = data?.queue.filter((mail) => mail.state === 'failed').length ?? 0;
  return (
    <>
      <PageHeader title="Outbox" lead={data ? mailerLine(data.mailer) : 'Mail sent by this server.'} />
      {error && <Notice tone="error">{error.message}</Notice>}
      {!data && !error && <LoadingBlock label="Loading mail…" />}
      {data && (
        <div className="grid items-start gap-6 lg:grid-cols-2">
          <Panel title="Received by the local mail server" aside={`${data.received.length} shown`}>
            {data.received.length === 0 ? (
              <p className="text-sm text-ink-soft">Nothing yet.</p>
            ) : (
              <ul aria-label="Received mail" className="-mt-2 divide-y divide-ink/10">
                {data.received.map((mail) => (
                  <li key={mail.id} className="py-2.5 text-sm">
                    <Link href={`/admin/mail/${mail.id}`} className="font-medium text-accent-strong hover:underline">
                      {mail.subject}
                    </Link>
                    <p className="text-xs text-ink-soft">
                      to {mail.to.join(', ')} · {formatDateTime(mail.receivedAt)}
                    </p>
                  </li>
                ))}
              </ul>
            )}
          </Panel>
          <Panel title="Outgoing queue" aside={failed > 0 ? `${failed} failed` : `${data.queue.length} shown`}>
            {data.queue.length === 0 ? (
              <p className="text-sm text-ink-soft">No mail sent yet.</p>
            ) : (
              <ul aria-label="Outgoing mail" className="-mt-2 divide-y divide-ink/10">
                {data.queue.map((mail) => (
                  <QueueRow key={mail.id} mail={mail} />
                ))}
              </ul>
            )}
          </Panel>
        </div>
      )}
    </>
  );
}
