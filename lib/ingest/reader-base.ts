// What the record readers share: byte counts, skipping of bad records (skip-bad), batching, the end checks.

import { IngestError } from './errors';
import type { IngestHeader } from './header';
import type { LineSource } from './lines';
import { MAX_KEPT_SKIP_ERRORS, type ParticleReader, type ParticleRecord, type ReaderOptions } from './types';

/** What a reader needs of its byte source: counts and closing (a LineSource, or a columnar file). */
export interface ByteSource {
  readonly bytesRead: number;
  readonly bytesTotal: number | null;
  close(): void;
}

export abstract class BaseReader<S extends ByteSource = LineSource> implements ParticleReader {
  skipped = 0;
  skippedErrors: IngestError[] = [];
  /** Good records read so far. */
  protected count = 0;
  private batch: ParticleRecord[] = [];
  private batchParticles = 0;

  constructor(
    readonly header: IngestHeader,
    protected readonly src: S,
    protected readonly opts: ReaderOptions,
  ) {}

  get bytesRead(): number {
    return this.src.bytesRead;
  }
  get bytesTotal(): number | null {
    return this.src.bytesTotal;
  }
  close(): void {
    this.src.close();
  }

  /** Counts a bad record when skipping bad records; otherwise (or for a file-level error) throws it. */
  protected skip(e: unknown): void {
    if (!(e instanceof IngestError) || !e.recordLevel || !this.opts.skipBad) throw e;
    this.skipped++;
    if (this.skippedErrors.length < MAX_KEPT_SKIP_ERRORS) this.skippedErrors.push(e);
    this.opts.onSkip?.(e);
  }

  /** Adds the record that `parse` returns to the batch (or skips it); returns the batch once it is full. */
  protected add(parse: () => ParticleRecord, maxParticles: number, maxRecords: number): ParticleRecord[] | null {
    let rec: ParticleRecord;
    try {
      rec = parse();
    } catch (e) {
      this.skip(e);
      return null;
    }
    this.count++;
    this.batch.push(rec);
    this.batchParticles += rec.particles.length >> 2;
    return this.batchParticles >= maxParticles || this.batch.length >= maxRecords ? this.takeBatch() : null;
  }

  /** The records added since the last full batch (null when none). */
  protected takeBatch(): ParticleRecord[] | null {
    if (this.batch.length === 0) return null;
    const b = this.batch;
    this.batch = [];
    this.batchParticles = 0;
    return b;
  }

  /** After the last record: a file without any valid record is an error. */
  protected requireRecords(what: string, noneMessage: string, line: number | null): void {
    if (this.count > 0) return;
    if (this.skipped > 0) {
      throw new IngestError(`no valid ${what}: all ${this.skipped} ${what}s were bad (first: ${this.skippedErrors[0]?.message})`, { code: 'empty' });
    }
    throw new IngestError(noneMessage, { line, code: 'empty' });
  }

  abstract batches(maxParticles?: number, maxRecords?: number): AsyncGenerator<ParticleRecord[]>;

  async *records(): AsyncGenerator<ParticleRecord> {
    for await (const b of this.batches(16384, 256)) yield* b;
  }
}
