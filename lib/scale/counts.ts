// Counts of shards added up into the sample's: every number of the same place summed (nested objects too).
import type { SampleCounts } from '@/models/sample-fields';

type Tree = number | null | undefined | { [key: string]: Tree };

function add(a: Tree, b: Tree): Tree {
  if (typeof a === 'number' && typeof b === 'number') return a + b;
  if (a === null || a === undefined) return b;
  if (b === null || b === undefined) return a;
  if (typeof a === 'object' && typeof b === 'object') {
    const sum: { [key: string]: Tree } = {};
    for (const key of new Set([...Object.keys(a), ...Object.keys(b)])) sum[key] = add(a[key], b[key]);
    return sum;
  }
  throw new TypeError('shard counts of different shapes');
}

export function sumCounts(counts: SampleCounts[]): SampleCounts {
  return counts.reduce((total, next) => add(total as unknown as Tree, next as unknown as Tree) as unknown as SampleCounts);
}
