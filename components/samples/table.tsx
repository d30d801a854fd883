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
  label: ReactNode;
  active: boolean;
  order: SortOrder;
  onSort: () => void;
  align?: 'left' | 'right';
  className?: string;
  /** Tooltip: what the column holds. */
  title?: string;
}

/** A column heading that sorts the table by its column; a second click reverses the order. */
export function SortHeader({ label, active, order, onSort, align = 'left', className = '', title }: SortHeaderProps) {
  const arrow = active ? (order === 'asc' ? '↑' : '↓') : '↕';
  return (
    <th
      scope="col"
      title={title}
      aria-sort={active ? (order === 'asc' ? 'ascending' : 'descending') : 'none'}
      className={`${headCellClass} ${align === 'right' ? 'text-right' : ''} ${className}`}
    >
      <button
        type="button"
        onClick={onSort}
        className={`inline-flex items-center gap-1 [letter-spacing:inherit] [text-transform:inherit] hover:text-ink ${active ? 'text-ink' : ''}`}
      >
        {label}
        <span aria-hidden className={active ? 'text-accent' : 'text-ink-faint'}>
          {arrow}
        </span>
      </button>
    </th>
  );
}

export interface SortState<K extends string> {
  key: K;
  order: SortOrder;
}

/** A click on a column heading: the sorted column flips its order, another starts in its usual one. */
export function nextSort<K extends string>(current: SortState<K>, key: K, firstOrder: SortOrder): SortState<K> {
  if (current.key !== key) return { key, order: firstOrder };
  return { key, order: current.order === 'asc' ? 'desc' : 'asc' };
}
