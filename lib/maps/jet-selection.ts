// A map's jet selection on a sample's jet table: pt range, |y| range, the leading N of each record, then the filter
// expression; each jet that falls is counted under the first cut it fails, so the counts add up to the jets stored.
import { compileFilter, evaluateFilter, FilterError } from './filter-expression';
import type { SampleColumns } from './sample-columns';
import type { JetSelection } from './view-settings';

export interface SelectedJets {
  /** Per stored jet: 1 when selected. */
  selected: Uint8Array;
  stored: number;
  count: number;
  /** N_jet = Σ w over the selected jets. */
  weight: number;
  /** Jets that fell, by the first cut they failed. */
  rejected: { pt: number; absY: number; leading: number; filter: number };
  /** Median pt of the selected jets (weighted by |w|), GeV; NaN when none is selected. */
  medianPt: number;
}

const inRange = (v: number, min: number | null, max: number | null) => (min === null || v >= min) && (max === null || v < max);

/**
 * Weighted median (by |w|) of the values where `keep` is 1, in linear time: a histogram of 4096 cells between the
 * smallest and largest value finds the cell holding half the weight, and only that cell's values are sorted.
 */
export function weightedMedian(values: ArrayLike<number>, weights: ArrayLike<number>, keep: Uint8Array): number {
  let min = Infinity;
  let max = -Infinity;
  let total = 0;
  for (let i = 0; i < keep.length; i++) {
    if (!keep[i] || !Number.isFinite(values[i])) continue;
    if (values[i] < min) min = values[i];
    if (values[i] > max) max = values[i];
    total += Math.abs(weights[i]);
  }
  if (!(min <= max)) return Number.NaN;
  if (min === max || !(total > 0)) return min;
  const cells = 4096;
  const scale = cells / (max - min);
  const cellOf = (v: number) => Math.min(cells - 1, Math.floor((v - min) * scale));
  const sums = new Float64Array(cells);
  for (let i = 0; i < keep.length; i++) if (keep[i] && Number.isFinite(values[i])) sums[cellOf(values[i])] += Math.abs(weights[i]);
  let below = 0;
  let cell = 0;
  while (cell < cells - 1 && below + sums[cell] < total / 2) below += sums[cell++];
  const inCell: number[] = [];
  for (let i = 0; i < keep.length; i++) if (keep[i] && Number.isFinite(values[i]) && cellOf(values[i]) === cell) inCell.push(i);
  inCell.sort((a, b) => values[a] - values[b]);
  let running = below;
  for (const i of inCell) {
    running += Math.abs(weights[i]);
    if (running >= total / 2) return values[i];
  }
  return values[inCell[inCell.length - 1]];
}

/** Throws FilterError for a refused filter (before any column is read). */
export async function selectJets(data: SampleColumns, selection: JetSelection): Promise<SelectedJets> {
  const filter = compileFilter(selection.filter);
  const [pt, y, jet, weight] = await Promise.all([data.jet('pt'), data.jet('y'), data.jet('jet'), data.jet('weight')]);
  const stored = pt.length;
  const selected = new Uint8Array(stored);
  const rejected = { pt: 0, absY: 0, leading: 0, filter: 0 };
  const leading = selection.leading ?? Infinity;
  for (let i = 0; i < stored; i++) {
    if (!inRange(pt[i], selection.ptMin, selection.ptMax)) rejected.pt++;
    else if (!inRange(Math.abs(y[i]), selection.absYMin, selection.absYMax)) rejected.absY++;
    else if (!(jet[i] < leading)) rejected.leading++;
    else selected[i] = 1;
  }
  if (filter) {
    const columns: Record<string, ArrayLike<number>> = {};
    for (const name of filter.columns) columns[name] = await data.jet(name);
    const keep = evaluateFilter(filter, columns, stored);
    for (let i = 0; i < stored; i++) {
      if (selected[i] && !keep[i]) {
        selected[i] = 0;
        rejected.filter++;
      }
    }
  }
  let count = 0;
  let total = 0;
  for (let i = 0; i < stored; i++) {
    if (!selected[i]) continue;
    count++;
    total += weight[i];
  }
  return { selected, stored, count, weight: total, rejected, medianPt: weightedMedian(pt, weight, selected) };
}

export { FilterError };
