import type { ReactNode } from 'react';

// The look of Splitfield's data tables: a raised box that scrolls sideways on narrow screens.
export const headCellClass = 'px-3 py-2.5 text-left text-xs font-medium uppercase tracking-wider whitespace-nowrap text-ink-soft';
export const cellClass = 'px-3 py-2.5 align-top';
export const numberCellClass = `${cellClass} text-right tabular-nums whitespace-nowrap`;

export function DataTable({ label, head, children }: { label: string; head: ReactNode; children: ReactNode }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-ink/10 bg-paper-raised">
      <table aria-label={label} className="w-full border-collapse text-sm">
        <thead className="border-b border-ink/10 bg-paper-sunk/60">
          <tr>{head}</tr>
        </thead>
        <tbody className="divide-y divide-ink/10">{children}</tbody>
      </table>
    </div>
  );
}

export type SortOrder = 'asc' | 'desc';

interface SortHeaderProps {
  label: string;
  active: boolean;
  order: SortOrder;
  onSort: () => void;
  align?: 'left' | 'right';
  className?: string;
}

/** A column heading that sorts the table by its column; a second click reverses the order. */
export function SortHeader({ label, active, order, onSort, align = 'left', className = '' }: SortHeaderProps) {
  const arrow = active ? (order === 'asc' ? '↑' : '↓') : '↕';
  return (
    <th
      scope="col"
      aria-sort={active ? (order === 'asc' ? 'ascending' : 'descending') : 'none'}
      className={`${headCellClass} ${align === 'right' ? 'text-right' : ''} ${className}`}
    >
      <button
        type="button"
        onClick={onSort}
        className={`inline-flex items-center gap-1 uppercase tracking-wider hover:text-ink ${active ? 'text-ink' : ''}`}
      >
        {label}
        <span aria-hidden className={active ? 'text-accent' : 'text-ink-faint'}>
          {arrow}
        </span>
      </button>
    </th>
  );
}
