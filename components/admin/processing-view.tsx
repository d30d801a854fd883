'use client';

import Link from 'next/link';
import useSWR from 'swr';
import type { ApiError } from '@/lib/api/client';
import type { OverviewJob, ProcessingOverview } from '@/lib/scale/overview';
import { EmptyState } from '../empty-state';
import { formatDateTime } from '../format';
import { useMe } from '../hooks/use-me';
import { LoadingBlock } from '../loading-block';
import { Notice } from '../notice';
import { PageHeader } from '../page-header';
import { Panel } from '../panel';

/** The admin page refreshes this often. */
const REFRESH_MS = 2000;

function Count({ label, value, tone }: { label: string; value: number; tone?: 'danger' }) {
  return (
    <div className="rounded-md border border-ink/10 bg-paper px-4 py-3">
      <div className="text-xs font-medium uppercase tracking-wider text-ink-soft">{label}</div>
      <div className={`font-mono text-2xl tabular-nums ${tone === 'danger' && value > 0 ? 'text-danger' : ''}`}>{value}</div>
    </div>
  );
}

function jobName(job: OverviewJob): string {
  if (job.kind === 'shard' && job.shard !== null) return `shard ${job.shard + 1}`;
  return job.kind;
}

function SampleLink({ id }: { id: number | null }) {
  return id === null ? <span>—</span> : <Link className="text-accent underline-offset-2 hover:underline" href={`/samples/${id}`}>sample {id}</Link>;
}

function RunningJobs({ jobs }: { jobs: ProcessingOverview['running'] }) {
  if (jobs.length === 0) return <p className="text-sm text-ink-soft">No job is running.</p>;
  return (
    <div className="overflow-x-auto">
    <table className="w-full whitespace-nowrap text-sm [&_td]:pr-4 [&_th]:pr-4">
      <thead className="text-left text-xs uppercase tracking-wider text-ink-soft">
        <tr>
          <th className="py-1 font-medium">Sample</th>
          <th className="font-medium">Job</th>
          <th className="font-medium">Worker</th>
          <th className="font-medium">Read</th>
          <th className="font-medium">Try</th>
          <th className="font-medium">Started</th>
        </tr>
      </thead>
      <tbody className="divide-y divide-ink/10">
        {jobs.map((job) => (
          <tr key={job.id}>
            <td className="py-1.5"><SampleLink id={job.sampleId} /></td>
            <td>{jobName(job)}</td>
            <td className="font-mono text-xs">{job.worker ?? '—'}</td>
            <td className="tabular-nums">{job.fraction === null ? '—' : `${Math.round(job.fraction * 100)} %`}</td>
            <td className="tabular-nums">{job.attempts}</td>
            <td>{job.startedAt ? formatDateTime(job.startedAt) : '—'}</td>
          </tr>
        ))}
      </tbody>
    </table>
    </div>
  );
}

function FailedJobs({ jobs }: { jobs: ProcessingOverview['failed'] }) {
  if (jobs.length === 0) return <p className="text-sm text-ink-soft">No failed shard in the last seven days.</p>;
  return (
    <ul className="divide-y divide-ink/10 text-sm">
      {jobs.map((job) => (
        <li key={job.id} className="py-2">
          <div className="flex flex-wrap gap-x-3">
            <SampleLink id={job.sampleId} />
            <span>{jobName(job)}</span>
            <span className="text-ink-soft">after {job.attempts} {job.attempts === 1 ? 'try' : 'tries'}</span>
          </div>
          <p className="mt-0.5 break-words font-mono text-xs text-danger">{job.reason}</p>
        </li>
      ))}
    </ul>
  );
}

/** Site administration: how processing is going, in either mode. */
export function ProcessingView() {
  const { me } = useMe();
  const isAdmin = me?.siteRole === 'admin';
  const { data, error } = useSWR<ProcessingOverview, ApiError>(isAdmin ? '/api/admin/processing' : null, { refreshInterval: REFRESH_MS });

  if (!me) return null;
  if (!isAdmin) return <EmptyState title="Admins only">This page shows the server&apos;s processing; your site role is member.</EmptyState>;
  const lead =
    data?.mode === 'queue'
      ? `Scaled mode: jobs go through the Redis queue to the workers; files live in ${data.store}.`
      : data
        ? `Embedded mode: jobs run in this server's worker threads; files live in ${data.store}.`
        : 'Processing jobs and where they run.';
  return (
    <>
      <PageHeader title="Processing" lead={lead} />
      {error && <Notice tone="error">{error.message}</Notice>}
      {!data && !error && <LoadingBlock label="Loading the queue…" />}
      {data && (
        <>
          <div className="mb-6 grid grid-cols-2 gap-3 sm:grid-cols-4">
            <Count label={data.mode === 'queue' ? 'Jobs waiting' : 'Samples queued'} value={data.counts.waiting} />
            <Count label="Running" value={data.counts.running} />
            <Count label="Waiting to retry" value={data.counts.delayed} />
            <Count label="Failed jobs" value={data.counts.failed} tone="danger" />
          </div>
          <Panel title="Running jobs" className="mb-6">
            <RunningJobs jobs={data.running} />
          </Panel>
          {data.mode === 'queue' && (
            <Panel title="Failed shards" lead="Jobs that used up their tries; their samples are marked failed.">
              <FailedJobs jobs={data.failed} />
            </Panel>
          )}
        </>
      )}
    </>
  );
}
