// Processing in the calling thread (threads = 1): each batch is parsed and processed where it is read, with the
// same code the worker threads run, so one thread and many give identical results.

import { processRecord } from '../../physics/process-record';
import type { RecordResult } from '../../physics/types';
import { formatForSink } from '../export';
import { processLineBatch } from '../process-lines';
import { ParticleScratch } from '../particle-scratch';
import { addStage, checkAbort, processingError, recordMeta, type BatchRun } from './batches';
import { countBatch } from './delivery';
import type { WorkerFormat } from './sink';

export async function processInThisThread(run: BatchRun, sinkFormat: WorkerFormat | null): Promise<void> {
  const { reader, settings, delivery, where } = run;
  const raw = reader.raw;
  if (raw) {
    // Raw records (JSON Lines, HepMC3): parse into a reused buffer and process at once, and format for the sink
    // (the workers' code).
    const scratch = new ParticleScratch();
    const batches = raw.rawBatches(run.batchChars, run.batchRecords);
    let t = performance.now();
    for (;;) {
      const next = await batches.next();
      t = addStage(run, 'read', t);
      if (next.done) break;
      const b = next.value;
      checkAbort(run);
      const o = processLineBatch(b, raw.context, settings, raw.skipBad, scratch, run.stages);
      t = performance.now();
      for (const pr of o.problems) raw.rejected(pr.error);
      if (o.error) throw processingError(o.metas[o.error.index].line, where, o.error.message);
      raw.accepted(o.results.length);
      if (sinkFormat) {
        const bytes = formatForSink(sinkFormat, o.metas, o.results);
        t = addStage(run, 'format', t);
        await delivery.deliverFormatted(bytes, countBatch(o.metas, o.results));
      } else await delivery.deliver(o.metas, o.results);
      if (b.kind === 'jsonl') raw.reuse?.(b.bytes.buffer);
      t = addStage(run, 'delivery', t);
    }
    raw.finish();
    return;
  }
  for await (const batch of reader.batches(run.batchParticles, run.batchRecords)) {
    checkAbort(run);
    const results: RecordResult[] = new Array(batch.length);
    for (let i = 0; i < batch.length; i++) {
      try {
        results[i] = processRecord(batch[i].particles, batch[i], settings);
      } catch (e) {
        throw processingError(batch[i].line, where, e instanceof Error ? e.message : String(e));
      }
    }
    await delivery.deliver(batch.map(recordMeta), results);
  }
}
