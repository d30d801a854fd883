import Link from 'next/link';
import { formatDate } from '../format';
import { formatCount } from './numbers';
import type { SampleSummary } from '@/lib/samples/shapes';
import { StateBadge } from './state-badge';
import type { SampleSort, SampleSortKey } from './sample-sort';
import { cellClass, DataTable, headCellClass, numberCellClass, SortHeader } from './table';

/** What a sample is called and where it belongs, as the first cell of a row; on narrow screens also its jets and study. */
function SampleNameCell({ sample }: { sample: SampleSummary }) {
  return (
    <td className={`${cellClass} min-w-36`}>
      <Link href={`/samples/${sample.id}`} className="font-medium break-words text-accent-strong hover:underline">
        {sample.name}
      </Link>
      <p className="mt-0.5 flex flex-wrap gap-x-2 text-xs text-ink-soft">
        {sample.label && <span className="font-mono">{sample.label}</span>}
        {sample.tags.length > 0 && <span>{sample.tags.map((tag) => `#${tag}`).join(' ')}</span>}
        <span className="md:hidden">{sample.studyTitle}</span>
        {sample.counts && <span className="sm:hidden">{formatCount(sample.counts.jets)} jets</span>}
      </p>
    </td>
  );
}

interface SampleTableProps {
  samples: SampleSummary[];
  sort: SampleSort;
  onSort: (key: SampleSortKey) => void;
}

/** Samples in rows, sortable by name, upload date, jets kept and state. */
export function SampleTable({ samples, sort, onSort }: SampleTableProps) {
  const header = (key: SampleSortKey, label: string, extra: { align?: 'right'; className?: string } = {}) => (
    <SortHeader label={label} active={sort.key === key} order={sort.order} onSort={() => onSort(key)} {...extra} />
  );
  return (
    <DataTable
      label="Samples"
      head={
        <>
          {header('name', 'Name')}
          <th scope="col" className={`${headCellClass} hidden md:table-cell`}>
            Study
          </th>
          {header('jets', 'Jets', { align: 'right', className: 'hidden sm:table-cell' })}
          {header('date', 'Uploaded')}
          {header('state', 'State')}
        </>
      }
    >
      {samples.map((sample) => (
        <tr key={sample.id} className="hover:bg-paper-sunk/40">
          <SampleNameCell sample={sample} />
          <td className={`${cellClass} hidden text-ink-soft md:table-cell`}>
            <Link href={`/studies/${sample.studyId}`} className="hover:text-ink hover:underline">
              {sample.studyTitle}
            </Link>
          </td>
          <td className={`${numberCellClass} hidden sm:table-cell`}>{sample.counts ? formatCount(sample.counts.jets) : '–'}</td>
          <td className={`${cellClass} whitespace-nowrap text-ink-soft`}>{formatDate(sample.createdAt)}</td>
          <td className={cellClass}>
            <StateBadge state={sample.state} />
          </td>
        </tr>
      ))}
    </DataTable>
  );
}
