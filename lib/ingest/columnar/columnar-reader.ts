// The reader of a columnar file (Parquet or Arrow IPC): chunks of rows from the format's own source become
// batches of records through the shared schema of layout.ts, with skip-bad and the end checks of every reader.

import { BaseReader, type ByteSource } from '../reader-base';
import type { IngestHeader } from '../header';
import type { ParticleRecord, ReaderOptions } from '../types';
import type { Chunk, ColumnPlan } from './layout';
import { RecordAssembler } from './layout';

/** What a columnar format provides: its chunks in file order, and byte counts. */
export interface ChunkSource extends ByteSource {
  chunks(plan: ColumnPlan): AsyncGenerator<Chunk>;
}

export class ColumnarReader extends BaseReader<ChunkSource> {
  constructor(
    header: IngestHeader,
    src: ChunkSource,
    opts: ReaderOptions,
    private readonly plan: ColumnPlan,
  ) {
    super(header, src, opts);
  }

  async *batches(maxParticles = 65536, maxRecords = 4096): AsyncGenerator<ParticleRecord[]> {
    const assembler = new RecordAssembler(this.plan, this.header);
    const full: ParticleRecord[][] = [];
    const add = (parse: () => ParticleRecord) => {
      const b = this.add(parse, maxParticles, maxRecords);
      if (b) full.push(b);
    };
    let rows = 0;
    for await (const chunk of this.src.chunks(this.plan)) {
      rows += chunk.rows;
      if (this.plan.layout === 'lists') assembler.listRecords(chunk, add);
      else assembler.flatRecords(chunk, add);
      yield* full.splice(0);
    }
    assembler.close(add);
    yield* full.splice(0);
    const last = this.takeBatch();
    if (last) yield last;
    this.requireRecords('record', rows === 0 ? 'the file has no rows' : 'the file has no records', null);
  }
}
