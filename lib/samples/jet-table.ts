// GET …/jets: one page of a sample's jet table, in file order or sorted by a column (undefined values last).
import { z } from 'zod';
import type { ColumnReader, JetColumnName, JetRow } from '@/lib/ingest/columns';
import { flavourName } from '@/lib/physics/flavour';
import type { JetRowView } from './shapes';
import { orderParam, wholeNumberParam } from './query-params';

export const MAX_JET_ROWS = 200;

/** Sortable view columns and the stored columns they come from; 'row' is the file order. */
const SORTABLE = {
  row: null,
  pt: 'pt',
  y: 'y',
  phi: 'phi',
  m: 'm',
  n: 'n',
  weight: 'weight',
  mg: 'mg',
  zg: 'zg',
  Rg: 'Rg',
  mult: 'multiplicity',
  flavour: 'flavour',
  E: 'E',
  theta: 'theta',
} as const satisfies Record<string, JetColumnName | null>;
const SORT_NAMES = Object.keys(SORTABLE) as [keyof typeof SORTABLE, ...(keyof typeof SORTABLE)[]];

export const jetPageQuery = z.strictObject({
  offset: wholeNumberParam('offset', 0, Number.MAX_SAFE_INTEGER).default(0),
  limit: wholeNumberParam('limit', 1, MAX_JET_ROWS).default(50),
  sort: z.enum(SORT_NAMES, { error: `sort must be one of: ${SORT_NAMES.join(', ')}` }).default('row'),
  /** Default: ascending for the file order, descending (largest first) for a column. */
  order: orderParam.optional(),
});

export type JetPageQuery = z.output<typeof jetPageQuery>;

function finiteOrNull(value: number): number | null {
  return Number.isFinite(value) ? value : null;
}

function jetRowView(row: JetRow): JetRowView {
  return {
    row: row.row,
    record: row.recordId,
    jet: row.jet,
    weight: row.weight,
    pt: row.pt,
    y: row.y,
    phi: row.phi,
    m: row.m,
    n: row.n,
    mg: finiteOrNull(row.mg),
    zg: finiteOrNull(row.zg),
    Rg: finiteOrNull(row.Rg),
    mult: row.multiplicity,
    flavour: flavourName(row.flavour),
    E: row.E,
    theta: row.theta,
  };
}

/** Row numbers [offset, offset + limit) of the jet table sorted by one column. */
async function sortedRows(reader: ColumnReader, column: JetColumnName, descending: boolean, offset: number, limit: number) {
  const values = await reader.jetColumn(column);
  const rows = Array.from({ length: values.length }, (_, row) => row);
  const sign = descending ? -1 : 1;
  rows.sort((a, b) => {
    const [va, vb] = [values[a], values[b]];
    if (Number.isNaN(va) || Number.isNaN(vb)) return Number.isNaN(va) ? (Number.isNaN(vb) ? a - b : 1) : -1;
    return sign * (va - vb) || a - b;
  });
  return rows.slice(offset, offset + limit);
}

export async function jetTablePage(reader: ColumnReader, query: JetPageQuery): Promise<{ total: number; jets: JetRowView[] }> {
  const total = reader.manifest.jets.rows;
  const column = SORTABLE[query.sort];
  const descending = (query.order ?? (column === null ? 'asc' : 'desc')) === 'desc';
  let rows: JetRow[];
  if (column === null && !descending) {
    rows = query.offset < total ? await reader.jetPage(query.offset, query.limit) : [];
  } else if (column === null) {
    const last = total - 1 - query.offset;
    rows = await reader.jetRowsAt(Array.from({ length: Math.max(0, Math.min(query.limit, last + 1)) }, (_, k) => last - k));
  } else {
    rows = await reader.jetRowsAt(await sortedRows(reader, column, descending, query.offset, query.limit));
  }
  return { total, jets: rows.map(jetRowView) };
}
