import type { ReactNode } from 'react';

export interface Stat {
  label: string;
  value: ReactNode;
  /** A line under the value, e.g. what a count includes. */
  note?: ReactNode;
}

/** A few headline numbers side by side (two a row on narrow screens). */
export function StatGrid({ stats, label }: { stats: Stat[]; label: string }) {
  return (
    <dl aria-label={label} className="grid grid-cols-2 gap-3 sm:grid-cols-4">
      {stats.map((stat) => (
        <div key={stat.label} className="rounded-md bg-paper-sunk/70 px-3 py-2.5">
          <dt className="text-xs text-ink-soft">{stat.label}</dt>
          <dd className="mt-0.5 text-lg font-semibold tabular-nums text-ink">{stat.value}</dd>
          {stat.note && <dd className="text-xs text-ink-faint">{stat.note}</dd>}
        </div>
      ))}
    </dl>
  );
}
