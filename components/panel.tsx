import type { ReactNode } from 'react';

interface PanelProps {
  title: string;
  /** Short text under the title. */
  lead?: string;
  /** Something shown at the right of the title, e.g. a count. */
  aside?: ReactNode;
  danger?: boolean;
  className?: string;
  children: ReactNode;
}

/** A raised box with a heading: one topic of a page. */
export function Panel({ title, lead, aside, danger, className = '', children }: PanelProps) {
  return (
    <section
      aria-label={title}
      className={`rounded-lg border bg-paper-raised p-5 ${danger ? 'border-danger/25' : 'border-ink/10'} ${className}`}
    >
      <div className="mb-3 flex items-baseline justify-between gap-2">
        <h2 className="font-semibold">{title}</h2>
        {aside && <span className="text-xs text-ink-faint">{aside}</span>}
      </div>
      {lead && <p className="-mt-2 mb-3 text-xs text-ink-soft">{lead}</p>}
      {children}
    </section>
  );
}
