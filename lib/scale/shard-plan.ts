// Where an upload is cut into shards: plain-text JSON Lines between records, plain-text HepMC3 before an event's
// E line. One pass over the object counts lines, so every shard knows the number of its first line (error
// messages and the default record ids are line numbers). Parquet is cut between row groups (row-group-plan.ts).
// Other inputs (gzip, the one-document form, Arrow) and small files are one shard read whole, exactly as the
// embedded mode reads them.
import { isParquetStart } from '@/lib/ingest/columnar/parquet-reader';
import { isGzipStart } from '@/lib/ingest/lines';
import type { ObjectStore } from '@/lib/objects/object-store';
import { planRowGroups, type RowGroupPlan } from './row-group-plan';

export interface LineShard {
  /** Bytes [start, end) of the upload. */
  start: number;
  end: number;
  /** Number of the shard's first line in the whole file. */
  firstLine: number;
}

export type ShardPlan =
  | { kind: 'whole' }
  | {
      kind: 'lines';
      format: 'jsonl' | 'hepmc3';
      /** Bytes [0, headerEnd) are the header every shard is read with. */
      headerEnd: number;
      /** Text that ends every shard but the last (HepMC3's end-of-listing line). */
      footer: string;
      shards: LineShard[];
    }
  | RowGroupPlan;

const HEPMC3_END = 'HepMC::Asciiv3-END_EVENT_LISTING\n';
const NEWLINE = 10;
const E = 69;
const SPACE = 32;
/** Bytes read to find the header. */
const HEAD_BYTES = 1024 * 1024;

type Format = 'jsonl' | 'hepmc3';

/** The format of a plain-text head and where its header ends, or null when the file is not cut. */
function headerOf(head: Buffer): { format: Format; headerEnd: number; headerLines: number } | null {
  if (isGzipStart(head)) return null;
  let at = 0;
  let lines = 0;
  while (at < head.length) {
    const newline = head.indexOf(NEWLINE, at);
    if (newline < 0) return null;
    const line = head.subarray(at, newline).toString('utf8').trim();
    lines++;
    if (line !== '') {
      if (line.startsWith('HepMC::')) return hepmcHeader(head, newline + 1, lines);
      return isJsonLinesHeader(line) ? { format: 'jsonl', headerEnd: newline + 1, headerLines: lines } : null;
    }
    at = newline + 1;
  }
  return null;
}

function isJsonLinesHeader(line: string): boolean {
  try {
    const parsed = JSON.parse(line) as unknown;
    return parsed !== null && typeof parsed === 'object' && !Array.isArray(parsed) && !('records' in parsed);
  } catch {
    return false;
  }
}

/** HepMC3's header runs to the first E line. */
function hepmcHeader(head: Buffer, from: number, linesBefore: number) {
  let at = from;
  let lines = linesBefore;
  while (at < head.length) {
    if (head[at] === E && head[at + 1] === SPACE) return { format: 'hepmc3' as const, headerEnd: at, headerLines: lines };
    const newline = head.indexOf(NEWLINE, at);
    if (newline < 0) return null;
    lines++;
    at = newline + 1;
  }
  return null;
}

/** Plans the shards of the upload `key` (of `size` bytes), cutting about every `shardBytes`. */
export async function planShards(store: ObjectStore, key: string, size: number, shardBytes: number): Promise<ShardPlan> {
  if (size <= shardBytes) return { kind: 'whole' };
  const head = Buffer.concat(await chunks(await store.read(key, { start: 0, end: Math.min(size, HEAD_BYTES) })));
  if (isParquetStart(head)) return (await planRowGroups(store, key, size, shardBytes)) ?? { kind: 'whole' };
  const header = headerOf(head);
  if (!header) return { kind: 'whole' };
  const { format, headerEnd } = header;
  const shards: LineShard[] = [];
  let shardStart = headerEnd;
  let shardFirstLine = header.headerLines + 1;
  let line = header.headerLines;
  let target = headerEnd + shardBytes;
  // A line starting at `start` (the file's line number `number`) may begin a new shard.
  const maybeCut = (start: number, number: number, first: number, second: number) => {
    if (start < target || start >= size) return;
    if (format === 'hepmc3' && !(first === E && second === SPACE)) return;
    shards.push({ start: shardStart, end: start, firstLine: shardFirstLine });
    shardStart = start;
    shardFirstLine = number;
    target = start + shardBytes;
  };
  let offset = headerEnd;
  for await (const chunk of await store.read(key, { start: headerEnd, end: size })) {
    const bytes = chunk as Buffer;
    let at = bytes.indexOf(NEWLINE);
    while (at >= 0) {
      line++;
      // A HepMC3 line whose first bytes are in the next chunk is not a cut: the next E line will be.
      if (format === 'jsonl' || at + 2 < bytes.length) maybeCut(offset + at + 1, line + 1, bytes[at + 1], bytes[at + 2]);
      at = bytes.indexOf(NEWLINE, at + 1);
    }
    offset += bytes.length;
  }
  shards.push({ start: shardStart, end: size, firstLine: shardFirstLine });
  return { kind: 'lines', format, headerEnd, footer: format === 'hepmc3' ? HEPMC3_END : '', shards };
}

async function chunks(stream: AsyncIterable<unknown>): Promise<Buffer[]> {
  const out: Buffer[] = [];
  for await (const chunk of stream) out.push(chunk as Buffer);
  return out;
}
