// Packing of record batches and their results into a few typed arrays, so that they cross to and from the
// worker threads by transfer (no copy, no per-object cloning).

import type { JetResult, ProcessSettings, RecordResult, RemovedParticles } from '../physics/types';
import { REMOVED_RULES } from '../physics/types';
import type { PlainIngestError } from './errors';
import type { RawLineBatch, RecordContext } from './types';
import type { BatchCounts, RecordMeta, StageTimes, WorkerFormat } from './pipeline/sink';
import type { ParticleRecord } from './types';

/** Records already parsed (in the main thread), particles back to back. */
export interface PackedTask {
  kind: 'packed';
  settings: ProcessSettings;
  /** All records' particles back to back (4 doubles a particle). */
  particles: Float64Array;
  /** Start of record i's particles in `particles` (in doubles); offsets[n] = particles.length. */
  offsets: Float64Array;
  /** Per-particle pids and charges of all records (same order as the particles), when every record has them. */
  pid?: Int32Array;
  charge?: Float64Array;
  /** Tag particles of all records back to back, record i's from tagOffsets[i] (doubles), and their pids. */
  tags?: Float64Array;
  tagOffsets?: Float64Array;
  tagPid?: Int32Array;
}

/** Unparsed records (JSON Lines records or HepMC3 event blocks): the worker parses, validates and processes them. */
export interface LinesTask {
  kind: 'lines';
  settings: ProcessSettings;
  batch: RawLineBatch;
  context: RecordContext;
  /** Go on after a bad record (report it in `problems`), else stop at the first. */
  skipBad: boolean;
  /** The sink's text to make here (the export), if any. */
  sinkFormat: WorkerFormat | null;
  /** Measure the worker's stages (parse, physics, format). */
  timings: boolean;
}

export type WorkerTask = PackedTask | LinesTask;

/**
 * Scalars a jet: pt, y, phi, m, n, mg, zg, Rg, multiplicity, primary length, all length (−1: null), flavour (−1:
 * none), E and theta (NaN: not set).
 */
export const JET_SCALARS = 14;
/** Ints a record: jets, rejected pt, y, rank, whether particles were selected, then REMOVED_RULES counts. */
const RECORD_INTS = 5 + REMOVED_RULES.length;

export interface WorkerResult {
  /** Per processed record: number of jets, rejected pt, rejected y, rejected rank. */
  perRecord: Int32Array;
  jets: Float64Array;
  primary: Float64Array;
  all: Float64Array;
  /** Lines tasks: the processed (good) records' id, weight, line and particle count. */
  meta: { ids: (string | number)[]; weights: Float64Array; lines: Float64Array; nParticles: Float64Array } | null;
  /** Lines tasks: bad records, in order; `before` = number of good records that precede it in the batch. */
  problems: { before: number; error: PlainIngestError }[];
  /** A record whose processing threw: its index among the processed records, and the message. */
  error: { index: number; message: string } | null;
  /**
   * Lines tasks with a sinkFormat: the sink's text (UTF-8) of the processed records and their counts; the results
   * themselves are not sent (perRecord, jets, primary and all are empty), and `meta` holds only the lines.
   */
  bytes: Uint8Array | null;
  counts: BatchCounts | null;
  /** Lines tasks of JSON Lines: the batch's byte buffer, handed back so that the reader can fill it again. */
  spent: ArrayBuffer | null;
  /** Lines tasks with timings: the worker's stage times (seconds). */
  times: Pick<StageTimes, 'parse' | 'physics' | 'format'> | null;
}

export function packTask(records: ParticleRecord[], settings: ProcessSettings): PackedTask {
  let n = 0;
  let nTags = 0;
  for (const r of records) {
    n += r.particles.length;
    if (r.tags) nTags += r.tags.length;
  }
  const particles = new Float64Array(n);
  const offsets = new Float64Array(records.length + 1);
  const withPid = records.every((r) => r.pid);
  const withCharge = records.every((r) => r.charge);
  const pid = withPid ? new Int32Array(n >> 2) : undefined;
  const charge = withCharge ? new Float64Array(n >> 2) : undefined;
  const tags = nTags ? new Float64Array(nTags) : undefined;
  const tagPid = nTags ? new Int32Array(nTags >> 2) : undefined;
  const tagOffsets = nTags ? new Float64Array(records.length + 1) : undefined;
  let at = 0;
  let tagAt = 0;
  for (let i = 0; i < records.length; i++) {
    const r = records[i];
    offsets[i] = at;
    particles.set(r.particles, at);
    pid?.set(r.pid!, at >> 2);
    charge?.set(r.charge!, at >> 2);
    if (tagOffsets) {
      tagOffsets[i] = tagAt;
      if (r.tags && r.tagPid) {
        tags!.set(r.tags, tagAt);
        tagPid!.set(r.tagPid, tagAt >> 2);
        tagAt += r.tags.length;
      }
    }
    at += r.particles.length;
  }
  offsets[records.length] = at;
  if (tagOffsets) tagOffsets[records.length] = tagAt;
  return { kind: 'packed', settings, particles, offsets, pid, charge, tags, tagOffsets, tagPid };
}

/** The transferable buffers of a lines task's batch. */
export function lineBuffers(b: RawLineBatch): ArrayBuffer[] {
  const arrays = b.kind === 'jsonl' ? [b.bytes, b.starts, b.ends, b.lineNos] : [b.lineNos];
  return arrays.map((a) => a.buffer as ArrayBuffer);
}

/** The transferable buffers of a packed task. */
export function taskBuffers(t: PackedTask): ArrayBuffer[] {
  return [t.particles, t.offsets, t.pid, t.charge, t.tags, t.tagOffsets, t.tagPid].filter((a) => a !== undefined).map((a) => a!.buffer as ArrayBuffer);
}

export function packResults(results: RecordResult[], error: WorkerResult['error'] = null): WorkerResult {
  let nJets = 0, nPrim = 0, nAll = 0;
  for (const r of results) {
    for (const j of r.jets) {
      nJets++;
      nPrim += j.primary.length;
      if (j.all) nAll += j.all.length;
    }
  }
  const perRecord = new Int32Array(RECORD_INTS * results.length);
  const jets = new Float64Array(JET_SCALARS * nJets);
  const primary = new Float64Array(nPrim);
  const all = new Float64Array(nAll);
  let jx = 0, px = 0, ax = 0;
  for (let i = 0; i < results.length; i++) {
    const r = results[i];
    const q = RECORD_INTS * i;
    perRecord[q] = r.jets.length;
    perRecord[q + 1] = r.rejected.pt;
    perRecord[q + 2] = r.rejected.y;
    perRecord[q + 3] = r.rejected.rank;
    if (r.removed) {
      perRecord[q + 4] = 1;
      REMOVED_RULES.forEach((rule, k) => (perRecord[q + 5 + k] = r.removed![rule]));
    }
    for (const j of r.jets) {
      jets[jx] = j.pt;
      jets[jx + 1] = j.y;
      jets[jx + 2] = j.phi;
      jets[jx + 3] = j.m;
      jets[jx + 4] = j.n;
      jets[jx + 5] = j.softDrop.mg;
      jets[jx + 6] = j.softDrop.zg;
      jets[jx + 7] = j.softDrop.Rg;
      jets[jx + 8] = j.multiplicity;
      jets[jx + 9] = j.primary.length;
      jets[jx + 10] = j.all ? j.all.length : -1;
      jets[jx + 11] = j.flavour ?? -1;
      jets[jx + 12] = j.E ?? NaN;
      jets[jx + 13] = j.theta ?? NaN;
      jx += JET_SCALARS;
      primary.set(j.primary, px);
      px += j.primary.length;
      if (j.all) {
        all.set(j.all, ax);
        ax += j.all.length;
      }
    }
  }
  return { perRecord, jets, primary, all, meta: null, problems: [], error, bytes: null, counts: null, spent: null, times: null };
}

/** The number of records a worker result holds. */
export function resultRecords(w: WorkerResult): number {
  return w.perRecord.length / RECORD_INTS;
}

export function unpackResults(w: WorkerResult, nRecords: number): RecordResult[] {
  const out: RecordResult[] = new Array(nRecords);
  const { perRecord, jets, primary, all } = w;
  let jx = 0, px = 0, ax = 0;
  for (let i = 0; i < nRecords; i++) {
    const q = RECORD_INTS * i;
    const nj = perRecord[q];
    const list: JetResult[] = new Array(nj);
    for (let k = 0; k < nj; k++) {
      const np = jets[jx + 9];
      const na = jets[jx + 10];
      list[k] = {
        pt: jets[jx],
        y: jets[jx + 1],
        phi: jets[jx + 2],
        m: jets[jx + 3],
        n: jets[jx + 4],
        softDrop: { mg: jets[jx + 5], zg: jets[jx + 6], Rg: jets[jx + 7] },
        multiplicity: jets[jx + 8],
        primary: primary.subarray(px, px + np),
        all: na < 0 ? null : all.subarray(ax, ax + na),
      };
      if (jets[jx + 11] >= 0) list[k].flavour = jets[jx + 11];
      if (!Number.isNaN(jets[jx + 12])) {
        list[k].E = jets[jx + 12];
        list[k].theta = jets[jx + 13];
      }
      px += np;
      if (na > 0) ax += na;
      jx += JET_SCALARS;
    }
    out[i] = { jets: list, rejected: { pt: perRecord[q + 1], y: perRecord[q + 2], rank: perRecord[q + 3] } };
    if (perRecord[q + 4] === 1) {
      const removed = {} as RemovedParticles;
      REMOVED_RULES.forEach((rule, k) => (removed[rule] = perRecord[q + 5 + k]));
      out[i].removed = removed;
    }
  }
  return out;
}

/** The record metadata of a lines task's result. */
export function unpackMeta(w: WorkerResult): RecordMeta[] {
  const m = w.meta!;
  const out: RecordMeta[] = new Array(m.ids.length);
  for (let i = 0; i < out.length; i++) out[i] = { line: m.lines[i], id: m.ids[i], weight: m.weights[i], nParticles: m.nParticles[i] };
  return out;
}

/** Buffers of a result that can be transferred. */
export function resultBuffers(r: WorkerResult): ArrayBuffer[] {
  const b = [r.perRecord.buffer, r.jets.buffer, r.primary.buffer, r.all.buffer] as ArrayBuffer[];
  if (r.meta) b.push(r.meta.weights.buffer as ArrayBuffer, r.meta.lines.buffer as ArrayBuffer, r.meta.nParticles.buffer as ArrayBuffer);
  if (r.bytes) b.push(r.bytes.buffer as ArrayBuffer);
  if (r.spent) b.push(r.spent);
  return b;
}
