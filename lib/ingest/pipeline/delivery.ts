// The last step of the pipeline: results reach the sink here, in input order, and are counted on the way; the
// same counts feed the progress reports and the run's summary.

import { REMOVED_RULES, SPLIT_STRIDE, type ProcessSettings, type RecordResult, type RemovedParticles } from '../../physics/types';
import type { ParticleReader } from '../types';
import { addFlavours } from './flavour-counts';
import type { BatchCounts, PipelineCounts, PipelineProgress, PipelineSummary, RecordMeta, ResultSink, StageTimes } from './sink';

/** The counts of consecutive records' results. */
export function countBatch(metas: RecordMeta[], results: RecordResult[]): BatchCounts {
  const c: BatchCounts = {
    records: 0,
    particles: 0,
    jets: 0,
    primarySplittings: 0,
    allSplittings: 0,
    rejected: { pt: 0, y: 0, rank: 0 },
    particlesRemoved: null,
    flavours: null,
  };
  for (let i = 0; i < metas.length; i++) {
    const res = results[i];
    c.records++;
    c.particles += metas[i].nParticles;
    c.jets += res.jets.length;
    for (const j of res.jets) {
      c.primarySplittings += j.primary.length / SPLIT_STRIDE;
      if (j.all) c.allSplittings += j.all.length / SPLIT_STRIDE;
    }
    c.rejected.pt += res.rejected.pt;
    c.rejected.y += res.rejected.y;
    c.rejected.rank += res.rejected.rank;
    if (res.removed) addRemoved((c.particlesRemoved ??= noneRemoved()), res.removed);
    addFlavours(c, res.jets);
  }
  return c;
}

function noneRemoved(): RemovedParticles {
  return { neutrino: 0, pidExcluded: 0, pidNotIncluded: 0, neutral: 0, pt: 0, rapidity: 0 };
}

function addRemoved(sum: RemovedParticles, more: RemovedParticles): void {
  for (const rule of REMOVED_RULES) sum[rule] += more[rule];
}

export class ResultDelivery {
  private readonly counts: PipelineCounts = {
    records: 0,
    particles: 0,
    jets: 0,
    primarySplittings: 0,
    allSplittings: 0,
    skipped: 0,
    rejected: { pt: 0, y: 0, rank: 0 },
    particlesRemoved: null,
    flavours: null,
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

  private add(c: BatchCounts): void {
    const counts = this.counts;
    counts.records += c.records;
    counts.particles += c.particles;
    counts.jets += c.jets;
    counts.primarySplittings += c.primarySplittings;
    counts.allSplittings += c.allSplittings;
    counts.rejected.pt += c.rejected.pt;
    counts.rejected.y += c.rejected.y;
    counts.rejected.rank += c.rejected.rank;
    if (c.particlesRemoved) addRemoved((counts.particlesRemoved ??= noneRemoved()), c.particlesRemoved);
    if (c.flavours) {
      const f = (counts.flavours ??= { b: 0, c: 0, light: 0 });
      f.b += c.flavours.b;
      f.c += c.flavours.c;
      f.light += c.flavours.light;
    }
  }

  /** Counts consecutive records' results, writes them to the sink (awaiting its backpressure), reports progress. */
  async deliver(metas: RecordMeta[], results: RecordResult[]): Promise<void> {
    this.add(countBatch(metas, results));
    await this.sink.write(metas, results);
    this.progress(false);
  }

  /** As deliver(), for records the sink's workerFormat text was made of where they were processed. */
  async deliverFormatted(bytes: Uint8Array, counts: BatchCounts): Promise<void> {
    this.add(counts);
    await this.sink.writeFormatted!(bytes, counts);
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
      particlesRemoved: counts.particlesRemoved && { ...counts.particlesRemoved },
      flavours: counts.flavours && { ...counts.flavours },
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
      particlesRemoved: counts.particlesRemoved && { ...counts.particlesRemoved },
      flavours: counts.flavours && { ...counts.flavours },
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
