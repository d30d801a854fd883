'use client';

import { useState } from 'react';
import useSWR from 'swr';
import type { ApiError } from '@/lib/api/client';
import type { JetRowView as JetRow } from '@/lib/samples/shapes';
import { Button } from '../button';
import { LoadingBlock } from '../loading-block';
import { Notice } from '../notice';
import { Panel } from '../panel';
import { Typeset } from '../typeset';
import { formatCount, formatValue } from './numbers';
import { cellClass, DataTable, nextSort, numberCellClass, SortHeader, type SortState } from './table';

const PAGE_SIZE = 25;

interface JetPage {
  total: number;
  jets: JetRow[];
}

type JetSortKey = 'row' | 'pt' | 'y' | 'E' | 'theta' | 'phi' | 'm' | 'n' | 'mg' | 'zg' | 'Rg' | 'mult' | 'flavour';

// Headings are typeset (components/typeset.tsx): "m_g" reads as m with a subscript g.
type Column = { key: Exclude<JetSortKey, 'row'>; heading: string; title: string; value: (jet: JetRow) => string };

/** The flavour column (samples processed with flavour tags): b, c or light, by ghost association. */
const FLAVOUR_COLUMN: Column = { key: 'flavour', heading: 'flavour', title: 'Flavour tag by ghost association: b, c or light', value: (jet) => jet.flavour ?? '–' };

/** Hadron-collider jets are described by pt and y; e+e- jets by energy and polar angle. */
const KINEMATICS: Record<'hadron' | 'ee', Column[]> = {
  hadron: [
    { key: 'pt', heading: 'p_T', title: 'Transverse momentum (GeV)', value: (jet) => formatValue(jet.pt) },
    { key: 'y', heading: 'y', title: 'Rapidity', value: (jet) => formatValue(jet.y) },
  ],
  ee: [
    { key: 'E', heading: 'E', title: 'Energy (GeV)', value: (jet) => formatValue(jet.E) },
    { key: 'theta', heading: 'θ', title: 'Polar angle, 0 to π', value: (jet) => formatValue(jet.theta) },
  ],
};

/** Numeric columns after the record and the kinematics: heading, tooltip, and how to write the value of a jet. */
const COLUMNS: Column[] = [
  { key: 'phi', heading: 'φ', title: 'Azimuth, 0 to 2π', value: (jet) => formatValue(jet.phi) },
  { key: 'm', heading: 'm', title: 'Mass (GeV)', value: (jet) => formatValue(jet.m) },
  { key: 'n', heading: 'n', title: 'Constituents', value: (jet) => formatCount(jet.n) },
  { key: 'mg', heading: 'm_g', title: 'SoftDrop groomed mass (GeV)', value: (jet) => formatValue(jet.mg) },
  { key: 'zg', heading: 'z_g', title: 'SoftDrop momentum fraction', value: (jet) => formatValue(jet.zg) },
  { key: 'Rg', heading: 'R_g', title: 'SoftDrop opening angle', value: (jet) => formatValue(jet.Rg) },
  { key: 'mult', heading: 'mult', title: 'Primary splittings above the multiplicity kₜ cut', value: (jet) => formatCount(jet.mult) },
];

function JetRows({ jets, columns }: { jets: JetRow[]; columns: Column[] }) {
  return jets.map((jet) => (
    <tr key={jet.row}>
      <td className={`${cellClass} whitespace-nowrap font-mono text-xs leading-5 text-ink-soft`}>
        {jet.record}
        {jet.jet > 0 && <span className="text-ink-faint"> · jet {jet.jet + 1}</span>}
      </td>
      {columns.map((column) => (
        <td key={column.key} className={numberCellClass}>
          {column.value(jet)}
        </td>
      ))}
    </tr>
  ));
}

/** The sample's kept jets a page at a time, in file order or sorted by a column (largest first). */
export function JetTable({ sampleId, collision = 'hadron', flavourTags = false }: { sampleId: number; collision?: 'hadron' | 'ee'; flavourTags?: boolean }) {
  const columns = [...KINEMATICS[collision], ...COLUMNS, ...(flavourTags ? [FLAVOUR_COLUMN] : [])];
  const [offset, setOffset] = useState(0);
  const [sort, setSort] = useState<SortState<JetSortKey>>({ key: 'row', order: 'asc' });
  const query = new URLSearchParams({ offset: String(offset), limit: String(PAGE_SIZE), sort: sort.key, order: sort.order });
  // The last page stays on screen, dimmed, while the next one loads; only then do the counts and buttons follow.
  const { data, error, isLoading } = useSWR<JetPage, ApiError>(`/api/samples/${sampleId}/jets?${query}`, { keepPreviousData: true });
  const shownTo = data ? Math.min(offset + data.jets.length, data.total) : 0;
  const pageLabel = !data || isLoading ? 'Loading jets…' : data.total === 0 ? 'No jets' : `Jets ${formatCount(offset + 1)}–${formatCount(shownTo)} of ${formatCount(data.total)}`;

  function sortBy(key: JetSortKey) {
    // File order starts from the top; a column starts with its largest values.
    setSort((current) => nextSort(current, key, key === 'row' ? 'asc' : 'desc'));
    setOffset(0);
  }

  const header = (key: JetSortKey, heading: string, title: string, align: 'left' | 'right') => (
    <SortHeader key={key} label={<Typeset text={heading} />} title={title} align={align} className="normal-case!" active={sort.key === key} order={sort.order} onSort={() => sortBy(key)} />
  );
  return (
    <Panel title="Jets" aside={data && `${formatCount(data.total)} kept`} lead="Values in GeV where they have a unit. SoftDrop in grooming mode keeps a jet whose splittings all fail as its last constituent (z_g = R_g = 0); a dash: the jet failed SoftDrop in tagging mode.">
      {error && <Notice tone="error">{error.message}</Notice>}
      {!data && !error && <LoadingBlock label="Loading jets…" />}
      {data && (
        <div className={`space-y-3 ${isLoading ? 'opacity-60' : ''}`} aria-busy={isLoading}>
          <DataTable
            label="Jets"
            head={
              <>
                {header('row', 'record', 'The record (and jet) in file order', 'left')}
                {columns.map((column) => header(column.key, column.heading, column.title, 'right'))}
              </>
            }
          >
            <JetRows jets={data.jets} columns={columns} />
          </DataTable>
          <nav aria-label="Jet pages" className="flex flex-wrap items-center justify-between gap-2 text-sm text-ink-soft">
            <span aria-live="polite">{pageLabel}</span>
            <span className="flex gap-2">
              <Button size="sm" disabled={isLoading || offset === 0} onClick={() => setOffset(Math.max(0, offset - PAGE_SIZE))}>
                Previous
              </Button>
              <Button size="sm" disabled={isLoading || shownTo >= data.total} onClick={() => setOffset(offset + PAGE_SIZE)}>
                Next
              </Button>
            </span>
          </nav>
        </div>
      )}
    </Panel>
  );
}
