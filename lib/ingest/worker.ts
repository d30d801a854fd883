// Worker-thread entry (piscina): parses (JSON Lines tasks) and processes a batch of records with the physics
// engine and sends the packed results back by transfer. Bundled to dist/engine/worker.js by
// scripts/build-engine.mjs.

import { move, transferableSymbol, valueSymbol } from 'piscina';
import { processRecord } from '../physics/process-record';
import type { RecordResult } from '../physics/types';
import { packResults, resultBuffers, type LinesTask, type PackedTask, type WorkerResult, type WorkerTask } from './codec';
import { formatForSink } from './export';
import { countBatch } from './pipeline/delivery';
import { processLineBatch } from './process-lines';
import { ParticleScratch } from './particle-scratch';

const scratch = new ParticleScratch();

function processPacked(task: PackedTask): WorkerResult {
  const { particles, offsets, settings, pid, charge, tags, tagOffsets, tagPid } = task;
  const n = offsets.length - 1;
  const results: RecordResult[] = [];
  for (let i = 0; i < n; i++) {
    const a = offsets[i], b = offsets[i + 1];
    const extras = {
      pid: pid?.subarray(a >> 2, b >> 2),
      charge: charge?.subarray(a >> 2, b >> 2),
      tags: tags?.subarray(tagOffsets![i], tagOffsets![i + 1]),
      tagPid: tagPid?.subarray(tagOffsets![i] >> 2, tagOffsets![i + 1] >> 2),
    };
    try {
      results.push(processRecord(particles.subarray(a, b), extras, settings));
    } catch (e) {
      return packResults(results, { index: i, message: e instanceof Error ? e.message : String(e) });
    }
  }
  return packResults(results);
}

function processLines(task: LinesTask): WorkerResult {
  const times = task.timings ? { parse: 0, physics: 0, format: 0 } : null;
  const o = processLineBatch(task.batch, task.context, task.settings, task.skipBad, scratch, times);
  const m = o.metas;
  let r: WorkerResult;
  if (task.sinkFormat) {
    // The sink's text and the counts are all the main thread needs (and the lines, for messages).
    const t = performance.now();
    r = packResults([], o.error);
    r.bytes = formatForSink(task.sinkFormat, m, o.results);
    r.counts = countBatch(m, o.results);
    if (times) times.format += (performance.now() - t) / 1000;
    r.meta = { ids: [], weights: new Float64Array(0), lines: Float64Array.from(m, (x) => x.line), nParticles: new Float64Array(0) };
  } else {
    r = packResults(o.results, o.error);
    r.meta = {
      ids: m.map((x) => x.id),
      weights: Float64Array.from(m, (x) => x.weight),
      lines: Float64Array.from(m, (x) => x.line),
      nParticles: Float64Array.from(m, (x) => x.nParticles),
    };
  }
  r.times = times;
  if (task.batch.kind === 'jsonl') r.spent = task.batch.bytes.buffer as ArrayBuffer;
  r.problems = o.problems.map((p) => ({ before: p.before, error: p.error.toPlain() }));
  return r;
}

export function processTask(task: WorkerTask): WorkerResult {
  return task.kind === 'lines' ? processLines(task) : processPacked(task);
}

export default function run(task: WorkerTask): unknown {
  const r = processTask(task);
  const movable = { [transferableSymbol]: resultBuffers(r), [valueSymbol]: r };
  return move(movable as unknown as ArrayBuffer);
}
