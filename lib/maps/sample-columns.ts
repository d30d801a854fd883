// A done sample's columns in memory for recomputed maps: each column is read from storage/samples/<id>/ on first
// use and kept in a process-wide cache with a memory budget (SPLITFIELD_MAP_CACHE_MB, default 1536 MB), least
// recently used first out. Coordinates other than the stored ln(1/Δ) and ln kt are derived once and kept too.
import { type ColumnReader, type JetColumnName, type SplittingColumnName } from '@/lib/ingest/columns';
import { type AxisChoice, coordinate, inTree, type TreeChoice } from '@/lib/physics/plane/axes';
import { openColumnFolder } from '@/lib/samples/column-files';
import { sampleStorage } from '@/lib/samples/storage';
import { Lru, processWide } from './lru';

export type Column = Float64Array | Int32Array | Uint8Array;

function budgetBytes(): number {
  const mb = Number(process.env.SPLITFIELD_MAP_CACHE_MB ?? 1536);
  return (Number.isFinite(mb) && mb > 0 ? mb : 1536) * 1024 * 1024;
}

const loaded = () => processWide('mapColumns', () => new Lru<Column>(budgetBytes(), (column) => column.byteLength));
const loading = () => processWide('mapColumnsLoading', () => new Map<string, Promise<Column>>());

/** The column under `${sampleKey}:${name}`, loaded once (concurrent callers share the load). */
async function cached<C extends Column>(sampleKey: string, name: string, load: () => Promise<C>): Promise<C> {
  const key = `${sampleKey}:${name}`;
  const hit = loaded().get(key);
  if (hit) return hit as C;
  const pending = loading().get(key);
  if (pending) return pending as Promise<C>;
  const promise = load()
    .then((column) => {
      loaded().set(key, column);
      return column;
    })
    .finally(() => loading().delete(key));
  loading().set(key, promise);
  return promise;
}

/** Bytes of columns held now. */
export function columnCacheBytes(): number {
  return loaded().size;
}

/** The columns of one done sample, as maps need them. */
export class SampleColumns {
  constructor(
    readonly sampleId: number,
    /** Names this processing of the sample in caches (sample-key.ts): an id reused later gets another key. */
    readonly key: string,
    /** Jet radius, for ln(R/Δ). */
    readonly R: number,
  ) {}

  private reader(): Promise<ColumnReader> {
    return openColumnFolder(sampleStorage(), this.sampleId);
  }

  /** Every record's id, in record order (read each time: only exports of per-jet values need them). */
  async recordIds(): Promise<string[]> {
    return (await this.reader()).recordIds();
  }

  jet<K extends JetColumnName>(name: K): Promise<Float64Array | Int32Array> {
    return cached(this.key, `jet.${name}`, async () => (await this.reader()).jetColumn(name));
  }

  splitting<K extends SplittingColumnName>(name: K): Promise<Float64Array | Int32Array> {
    return cached(this.key, `splitting.${name}`, async () => (await this.reader()).splittingColumn(name));
  }

  /** The binned coordinate of every stored splitting on this axis. */
  coordinate(axis: AxisChoice): Promise<Float64Array> {
    if (axis.variable === 'lnInvDelta') return this.splitting('lnInvDelta') as Promise<Float64Array>;
    if (axis.variable === 'lnKt' || (axis.variable === 'kt' && axis.log)) return this.splitting('lnKt') as Promise<Float64Array>;
    const name = `coordinate.${axis.variable}.${axis.log ? 'log' : 'linear'}`;
    return cached(this.key, name, async () => {
      const [delta, z, kt] = await Promise.all([this.splitting('delta'), this.splitting('z'), this.splitting('kt')]);
      const out = new Float64Array(delta.length);
      for (let i = 0; i < out.length; i++) out[i] = coordinate(axis, delta[i], z[i], kt[i], this.R);
      return out;
    });
  }

  /** 1 for the stored splittings that belong to the tree choice; null when all of them do. */
  async members(tree: TreeChoice, storedTree: 'primary' | 'full'): Promise<Uint8Array | null> {
    if (tree === 'all' || (tree === 'primary' && storedTree === 'primary')) return null;
    return cached(this.key, `members.${tree}`, async () => {
      const generation = await this.splitting('generation');
      const out = new Uint8Array(generation.length);
      for (let i = 0; i < out.length; i++) out[i] = inTree(tree, generation[i]) ? 1 : 0;
      return out;
    });
  }
}
