// The last step of the pipeline: results reach the sink here, in input order, and are counted on the way; the
// same counts feed the progress reports and the run's summary.

import { SPLIT_STRIDE, type ProcessSettings, type RecordResult } from '../../physics/types';
import type { ParticleReader } from '../types';
import type { PipelineCounts, PipelineProgress, PipelineSummary, RecordMeta, ResultSink, StageTimes } from './sink';

export class ResultDelivery {
  private readonly counts: PipelineCounts = {
    records: 0,
    particles: 0,
    jets: 0,
    primarySplittings: 0,
    allSplittings: 0,
    skipped: 0,
    rejected: { pt: 0, y: 0, rank: 0 },
  };
  private lastProgress = -Infinity;

  constructor(
    private readonly reader: ParticleReader,
    private readonly sink: ResultSink,
    private readonly t0: number,
    private readonly onProgress: ((p: PipelineProgress) => void) | undefined,
    /** Minimum time between two progress calls (the final call always happens). */
    private readonly progressIntervalMs: number,
  ) {}

  /**
   * Counts consecutive records' results, writes them to the sink (awaiting its backpressure), reports progress.
   * `bytes`: their text for the sink's workerFormat, made where they were processed.
   */
  async deliver(metas: RecordMeta[], results: RecordResult[], bytes?: Uint8Array): Promise<void> {
    const counts = this.counts;
    for (let i = 0; i < metas.length; i++) {
      const res = results[i];
      counts.records++;
      counts.particles += metas[i].nParticles;
      counts.jets += res.jets.length;
      for (const j of res.jets) {
        counts.primarySplittings += j.primary.length / SPLIT_STRIDE;
        if (j.all) counts.allSplittings += j.all.length / SPLIT_STRIDE;
      }
      counts.rejected.pt += res.rejected.pt;
      counts.rejected.y += res.rejected.y;
      counts.rejected.rank += res.rejected.rank;
    }
    await this.sink.write(metas, results, bytes);
    this.progress(false);
  }

  progress(done: boolean): void {
    if (!this.onProgress) return;
    const now = performance.now();
    if (!done && now - this.lastProgress < this.progressIntervalMs) return;
    this.lastProgress = now;
    const { reader, counts } = this;
    this.onProgress({
      ...counts,
      rejected: { ...counts.rejected },
      skipped: reader.skipped,
      bytesRead: reader.bytesRead,
      bytesTotal: reader.bytesTotal,
      elapsedMs: now - this.t0,
      done,
    });
  }

  /** The whole run's figures, once the reader is exhausted. */
  summary(settings: ProcessSettings, threads: number, stages: StageTimes | null): PipelineSummary {
    const { reader, counts } = this;
    counts.skipped = reader.skipped;
    return {
      ...counts,
      rejected: { ...counts.rejected },
      header: reader.header,
      settings,
      threads,
      bytesRead: reader.bytesRead,
      bytesTotal: reader.bytesTotal,
      elapsedMs: performance.now() - this.t0,
      skippedErrors: reader.skippedErrors.map((e) => e.message),
      stages,
    };
  }
}
