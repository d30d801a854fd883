'use client';

import { useState } from 'react';
import useSWR from 'swr';
import type { ApiError } from '@/lib/fetcher';
import { Button } from '../button';
import { LoadingBlock } from '../loading-block';
import { Notice } from '../notice';
import { Panel } from '../panel';
import { formatCount, formatValue } from './numbers';
import type { JetRowView as JetRow } from '@/lib/samples/shapes';
import { cellClass, DataTable, headCellClass, numberCellClass } from './table';

const PAGE_SIZE = 25;

interface JetPage {
  total: number;
  jets: JetRow[];
}

/** Numeric columns after the record: heading, and how to read the value off a jet. */
const COLUMNS: { heading: string; title: string; value: (jet: JetRow) => string }[] = [
  { heading: 'pt', title: 'Transverse momentum (GeV)', value: (jet) => formatValue(jet.pt) },
  { heading: 'y', title: 'Rapidity', value: (jet) => formatValue(jet.y) },
  { heading: 'φ', title: 'Azimuth, 0 to 2π', value: (jet) => formatValue(jet.phi) },
  { heading: 'm', title: 'Mass (GeV)', value: (jet) => formatValue(jet.m) },
  { heading: 'n', title: 'Constituents', value: (jet) => formatCount(jet.n) },
  { heading: 'm_g', title: 'SoftDrop groomed mass (GeV)', value: (jet) => formatValue(jet.mg) },
  { heading: 'z_g', title: 'SoftDrop momentum fraction', value: (jet) => formatValue(jet.zg) },
  { heading: 'R_g', title: 'SoftDrop opening angle', value: (jet) => formatValue(jet.Rg) },
  { heading: 'mult', title: 'Primary splittings above the multiplicity kt cut', value: (jet) => formatCount(jet.mult) },
];

function JetRows({ jets }: { jets: JetRow[] }) {
  return jets.map((jet) => (
    <tr key={jet.row}>
      <td className={`${cellClass} whitespace-nowrap font-mono text-xs text-ink-soft`}>
        {String(jet.record)}
        {jet.jet > 0 && <span className="text-ink-faint"> · jet {jet.jet + 1}</span>}
      </td>
      {COLUMNS.map((column) => (
        <td key={column.heading} className={numberCellClass}>
          {column.value(jet)}
        </td>
      ))}
    </tr>
  ));
}

/** The sample's kept jets, a page at a time. A dash marks a jet where no splitting passed SoftDrop. */
export function JetTable({ sampleId }: { sampleId: number }) {
  const [offset, setOffset] = useState(0);
  const { data, error } = useSWR<JetPage, ApiError>(`/api/samples/${sampleId}/jets?offset=${offset}&limit=${PAGE_SIZE}`, {
    keepPreviousData: true,
  });
  const shownTo = data ? Math.min(offset + data.jets.length, data.total) : 0;
  return (
    <Panel title="Jets" aside={data && `${formatCount(data.total)} kept`} lead="Values in GeV where they have a unit. A dash: no splitting passed SoftDrop.">
      {error && <Notice tone="error">{error.message}</Notice>}
      {!data && !error && <LoadingBlock label="Loading jets…" />}
      {data && (
        <div className="space-y-3">
          <DataTable
            label="Jets"
            head={
              <>
                <th scope="col" className={headCellClass}>
                  Record
                </th>
                {COLUMNS.map((column) => (
                  <th key={column.heading} scope="col" title={column.title} className={`${headCellClass} text-right normal-case`}>
                    {column.heading}
                  </th>
                ))}
              </>
            }
          >
            <JetRows jets={data.jets} />
          </DataTable>
          <nav aria-label="Jet pages" className="flex flex-wrap items-center justify-between gap-2 text-sm text-ink-soft">
            <span aria-live="polite">
              {data.total === 0 ? 'No jets' : `Jets ${formatCount(offset + 1)}–${formatCount(shownTo)} of ${formatCount(data.total)}`}
            </span>
            <span className="flex gap-2">
              <Button size="sm" disabled={offset === 0} onClick={() => setOffset(Math.max(0, offset - PAGE_SIZE))}>
                Previous
              </Button>
              <Button size="sm" disabled={shownTo >= data.total} onClick={() => setOffset(offset + PAGE_SIZE)}>
                Next
              </Button>
            </span>
          </nav>
        </div>
      )}
    </Panel>
  );
}
