// Parses, validates and processes a batch of unparsed records (JSON Lines records or HepMC3 event blocks): the
// same code in this thread (threads = 1)
// and in the worker threads, so that both give identical results and identical errors.

import { processRecord } from '../physics/process-record';
import type { ProcessSettings, RecordResult } from '../physics/types';
import { IngestError } from './errors';
import { parseHepMCEventInto } from './hepmc3-reader';
import { ParticleScratch } from './particle-scratch';
import { parseRecordBytesInto } from './record';
import type { RawLineBatch, RecordContext } from './types';
import type { RecordMeta, StageTimes } from './pipeline/sink';

export interface LineBatchOutcome {
  /** The good records, in order, and their results. */
  metas: RecordMeta[];
  results: RecordResult[];
  /** Bad records in order; `before` = number of good records that precede each. */
  problems: { before: number; error: IngestError }[];
  /** A record whose processing threw (index among the good records, whose meta is included); processing stopped there. */
  error: { index: number; message: string } | null;
}

export function processLineBatch(
  batch: RawLineBatch,
  context: RecordContext,
  settings: ProcessSettings,
  skipBad: boolean,
  scratch: ParticleScratch,
  /** Adds the time spent parsing and in the physics here, when given. */
  times: Pick<StageTimes, 'parse' | 'physics'> | null = null,
): LineBatchOutcome {
  const metas: RecordMeta[] = [];
  const results: RecordResult[] = [];
  const problems: LineBatchOutcome['problems'] = [];
  let error: LineBatchOutcome['error'] = null;
  let t = times ? performance.now() : 0;
  const lineNos = batch.lineNos;
  for (let i = 0; i < lineNos.length; i++) {
    let rec;
    try {
      rec = batch.kind === 'jsonl'
        ? parseRecordBytesInto(batch.bytes, batch.starts[i], batch.ends[i], lineNos[i], context, scratch)
        : parseHepMCEventInto(batch.lines[i], lineNos[i], scratch);
    } catch (e) {
      if (!(e instanceof IngestError)) throw e;
      problems.push({ before: results.length, error: e });
      if (!skipBad || !e.recordLevel) break;
      continue;
    }
    metas.push({ line: rec.line, id: rec.id, weight: rec.weight, nParticles: rec.n });
    if (times) {
      const now = performance.now();
      times.parse += (now - t) / 1000;
      t = now;
    }
    try {
      results.push(processRecord(scratch.buf.subarray(0, 4 * rec.n), rec, settings));
    } catch (e) {
      error = { index: results.length, message: e instanceof Error ? e.message : String(e) };
      break;
    }
    if (times) {
      const now = performance.now();
      times.physics += (now - t) / 1000;
      t = now;
    }
  }
  return { metas, results, problems, error };
}
