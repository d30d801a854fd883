import type { SampleSummary } from '@/lib/samples/shapes';
import type { SortOrder, SortState } from './table';

export type SampleSortKey = 'name' | 'date' | 'jets' | 'state';
export type SampleSort = SortState<SampleSortKey>;

/** A newly chosen column starts in the order people usually want: newest and largest first, names A to Z. */
export const FIRST_ORDER: Record<SampleSortKey, SortOrder> = { name: 'asc', date: 'desc', jets: 'desc', state: 'asc' };

/** The list API's name of each order; it has none for jets, which the page sorts itself. */
const API_SORT: Record<SampleSortKey, string | null> = { name: 'name', date: 'createdAt', jets: null, state: 'state' };

/** The sort and order query of the list request. */
export function sortQuery(sort: SampleSort): Record<string, string> {
  const apiSort = API_SORT[sort.key];
  return apiSort ? { sort: apiSort, order: sort.order } : {};
}

/** The samples in the chosen order, when the API could not order them (jets kept; unprocessed samples last). */
export function sortedSamples(samples: SampleSummary[], sort: SampleSort): SampleSummary[] {
  if (API_SORT[sort.key]) return samples;
  const sign = sort.order === 'asc' ? 1 : -1;
  const jets = (sample: SampleSummary) => sample.counts?.jets ?? null;
  return [...samples].sort((a, b) => {
    const ja = jets(a);
    const jb = jets(b);
    if (ja === null || jb === null) return (ja === null ? 1 : 0) - (jb === null ? 1 : 0);
    return sign * (ja - jb);
  });
}
