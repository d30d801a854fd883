'use client';

// The study's activity: who added which entry, sample, region or comment and when, newest first, with what is new
// since the reader last marked it read.
import Link from 'next/link';
import { useState } from 'react';
import useSWR from 'swr';
import { type ApiError, messageOf, sendJson } from '@/lib/api/client';
import type { ActivityFeed, ActivityKind } from '@/lib/regions/shapes';
import { Button } from '../button';
import { formatDateTime } from '../format';
import { Notice } from '../notice';
import { Panel } from '../panel';

const VERBS: Record<ActivityKind, string> = {
  entry: 'added',
  sample: 'added',
  region: 'drew',
  comment: 'wrote a',
  'region-resolved': 'resolved',
  'region-reopened': 'reopened',
};

/** Shown at first; the rest on request. */
const FIRST = 12;

export function ActivityPanel({ studyId }: { studyId: string }) {
  const url = `/api/studies/${studyId}/activity`;
  const { data, error, mutate } = useSWR<ActivityFeed, ApiError>(url, { refreshInterval: 30_000 });
  const [all, setAll] = useState(false);
  const [failure, setFailure] = useState<string | null>(null);
  async function markRead() {
    try {
      await sendJson('POST', url);
      await mutate();
    } catch (problem) {
      setFailure(messageOf(problem));
    }
  }
  const items = data?.items ?? [];
  return (
    <Panel title="Activity" aside={data && data.unreadCount > 0 ? `${data.unreadCount} new` : undefined}>
      {error && <Notice tone="error">{error.message}</Notice>}
      {failure && <Notice tone="error">{failure}</Notice>}
      {data && items.length === 0 && <p className="text-sm text-ink-soft">Nothing yet.</p>}
      <ol className="space-y-2 text-sm" aria-label="Activity">
        {(all ? items : items.slice(0, FIRST)).map((item) => (
          <li key={item.key} className="flex gap-2" data-unread={item.unread || undefined}>
            <span aria-hidden className={`mt-1.5 h-2 w-2 shrink-0 rounded-full ${item.unread ? 'bg-accent' : 'bg-transparent'}`} />
            <span className="min-w-0">
              {item.unread && <span className="sr-only">New: </span>}
              <span className="font-medium">{item.actor?.name ?? 'A former member'}</span> {VERBS[item.kind]}{' '}
              <Link href={item.link} className="text-accent-strong hover:underline">
                {item.what}
              </Link>
              <span className="block text-xs text-ink-faint">{formatDateTime(item.at)}</span>
            </span>
          </li>
        ))}
      </ol>
      <div className="mt-3 flex flex-wrap gap-2">
        {items.length > FIRST && (
          <Button size="sm" variant="ghost" onClick={() => setAll(!all)}>
            {all ? 'Show fewer' : `Show all ${items.length}`}
          </Button>
        )}
        {data && data.unreadCount > 0 && (
          <Button size="sm" onClick={markRead}>
            Mark all as read
          </Button>
        )}
      </div>
    </Panel>
  );
}
