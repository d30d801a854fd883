// GET …/export: a done sample as splitfield-declusterings JSON Lines, rebuilt from its stored columns chunk by
// chunk (bounded memory whatever the sample's size) and written by the export writer of lib/ingest/export.ts.
import { z } from 'zod';
import { ApiError } from '@/lib/api/errors';
import {
  type ColumnReader,
  JET_COLUMNS,
  type JetColumnName,
  SPLIT_FIELD_OF,
  SPLITTING_COLUMNS,
  type SplittingColumnName,
} from '@/lib/ingest/columns';
import { exportHeader, formatJets, jetLineStyle } from '@/lib/ingest/export';
import type { IngestHeader } from '@/lib/ingest/header';
import type { RecordMeta } from '@/lib/ingest/pipeline/sink';
import { type JetResult, type RecordResult, S_GENERATION, SPLIT_STRIDE } from '@/lib/physics/types';
import type { Sample } from '@/models/sample';
import { completeSettings } from '../ingest/settings';

const JETS_PER_CHUNK = 4096;
const SPLITTINGS_PER_BLOCK = 65_536;

export const exportQuery = z.strictObject({
  all: z
    .enum(['0', '1'], { error: 'all must be 0 (primary splittings) or 1 (every splitting)' })
    .default('0')
    .transform((value) => value === '1'),
});

type Columns<N extends string> = Record<N, Float64Array | Int32Array>;

/** Walks the splitting table in order, handing out each jet's splittings in the engine's layout. */
class SplittingCursor {
  private block: Columns<SplittingColumnName> | null = null;
  private blockStart = 0;
  private at = 0;

  constructor(private readonly reader: ColumnReader) {}

  private async ensure(): Promise<boolean> {
    const total = this.reader.manifest.splittings.rows;
    if (this.block && this.at < this.blockStart + this.block.jetRow.length) return true;
    if (this.at >= total) return false;
    const count = Math.min(SPLITTINGS_PER_BLOCK, total - this.at);
    const block = {} as Columns<SplittingColumnName>;
    for (const name of Object.keys(SPLITTING_COLUMNS) as SplittingColumnName[]) {
      block[name] = await this.reader.splittingColumnRange(name, this.at, count);
    }
    this.block = block;
    this.blockStart = this.at;
    return true;
  }

  /** The splittings of jet `row` (SPLIT_STRIDE doubles each), in stored order. */
  async take(row: number): Promise<Float64Array> {
    const values: number[] = [];
    while ((await this.ensure()) && this.block!.jetRow[this.at - this.blockStart] === row) {
      const k = this.at - this.blockStart;
      const start = values.length;
      values.length += SPLIT_STRIDE;
      for (const [name, field] of Object.entries(SPLIT_FIELD_OF)) {
        values[start + field] = this.block![name as SplittingColumnName][k];
      }
      this.at++;
    }
    return Float64Array.from(values);
  }
}

/** The primary sequence of a full tree: the generation-1 splittings, which the tree lists in declustering order. */
function primaryOf(all: Float64Array): Float64Array {
  const kept: number[] = [];
  for (let at = 0; at < all.length; at += SPLIT_STRIDE) {
    if (all[at + S_GENERATION] === 1) kept.push(...all.subarray(at, at + SPLIT_STRIDE));
  }
  return Float64Array.from(kept);
}

async function jetChunk(reader: ColumnReader, first: number, count: number): Promise<Columns<JetColumnName>> {
  const chunk = {} as Columns<JetColumnName>;
  for (const name of Object.keys(JET_COLUMNS) as JetColumnName[]) chunk[name] = await reader.jetColumnRange(name, first, count);
  return chunk;
}

/** The export's lines, each with its newline: the header, then one line a jet in stored order. */
export async function* exportLines(sample: Sample, reader: ColumnReader, all: boolean): AsyncGenerator<string> {
  const fullTree = reader.manifest.tree === 'full';
  if (all && !fullTree) {
    throw new ApiError(
      409,
      'full_tree_not_stored',
      `Sample ${sample.id} stores only the primary splittings; to export every splitting, upload the file again ` +
        'with the setting "fullTree": true.',
    );
  }
  const input = sample.input as IngestHeader;
  const settings = completeSettings(sample.settings);
  // The lines carry "all" when asked for; the header keeps the sample's own fullTree setting and says which lists it carries.
  const style = jetLineStyle({ ...settings, fullTree: all });
  yield `${JSON.stringify(exportHeader(input, { ...settings, content: input.content }, sample.fileName, all))}\n`;
  const splittings = new SplittingCursor(reader);
  const totalJets = reader.manifest.jets.rows;
  // The record being written: its jets may continue in the next chunk, so it is written with the chunk it ends in.
  let open: { record: number; meta: RecordMeta; result: RecordResult } | null = null;
  for (let first = 0; first < totalJets; first += JETS_PER_CHUNK) {
    const count = Math.min(JETS_PER_CHUNK, totalJets - first);
    const jets = await jetChunk(reader, first, count);
    const firstRecord = jets.record[0];
    const ids = await reader.recordIds(firstRecord, jets.record[count - 1] - firstRecord + 1);
    const metas: RecordMeta[] = open ? [open.meta] : [];
    const results: RecordResult[] = open ? [open.result] : [];
    for (let k = 0; k < count; k++) {
      const stored = await splittings.take(first + k);
      const jet: JetResult = {
        pt: jets.pt[k],
        y: jets.y[k],
        phi: jets.phi[k],
        m: jets.m[k],
        n: jets.n[k],
        primary: fullTree ? primaryOf(stored) : stored,
        all: fullTree ? stored : null,
        softDrop: { mg: jets.mg[k], zg: jets.zg[k], Rg: jets.Rg[k] },
        multiplicity: jets.multiplicity[k],
        E: jets.E[k],
        theta: jets.theta[k],
      };
      if (jets.flavour[k] >= 0) jet.flavour = jets.flavour[k];
      if (open?.record === jets.record[k]) {
        open.result.jets.push(jet);
        continue;
      }
      const id = ids[jets.record[k] - firstRecord];
      open = { record: jets.record[k], meta: { line: 0, id, weight: jets.weight[k], nParticles: 0 }, result: { jets: [jet], rejected: { pt: 0, y: 0, rank: 0 } } };
      metas.push(open.meta);
      results.push(open.result);
    }
    if (first + count < totalJets) {
      metas.pop();
      results.pop();
    }
    yield formatJets(metas, results, style);
  }
}
