// Where a job's pipeline puts its results: the binary columns of the sample (committed into place only at the end)
// and the fine primary-plane histograms in both horizontal coordinates, for the cache in SQLite.
import { ColumnWriter } from '@/lib/ingest/columns';
import type { IngestHeader } from '@/lib/ingest/header';
import type { RecordMeta, ResultSink } from '@/lib/ingest/pipeline/sink';
import { defaultGrid, PlaneHistogram } from '@/lib/physics/density';
import type { ProcessSettings, RecordResult } from '@/lib/physics/types';
import type { FinishedPlane } from './messages';

export class SampleSink implements ResultSink {
  private columns: ColumnWriter | null = null;
  private planes: Array<[FinishedPlane['horizontal'], PlaneHistogram]> = [];

  /** `onBegin` hears the input's header before the first record. */
  constructor(
    private readonly sampleDir: string,
    private readonly onBegin: (header: IngestHeader) => void,
  ) {}

  async begin(header: IngestHeader, settings: ProcessSettings): Promise<void> {
    this.onBegin(header);
    this.planes = [
      ['lnInvDelta', new PlaneHistogram(defaultGrid('lnInvDelta'))],
      ['lnRoverDelta', new PlaneHistogram(defaultGrid('lnRoverDelta', settings.jet.R))],
    ];
    this.columns = await ColumnWriter.create(this.sampleDir, { tree: settings.fullTree ? 'full' : 'primary' });
  }

  async write(records: RecordMeta[], results: RecordResult[]): Promise<void> {
    for (let r = 0; r < records.length; r++) {
      for (const jet of results[r].jets) {
        for (const [, plane] of this.planes) plane.fillJet(jet.primary, records[r].weight);
      }
    }
    await this.columns!.append(records, results);
  }

  async end(): Promise<void> {
    await this.columns!.commit();
  }

  async abort(): Promise<void> {
    await this.columns?.abort();
  }

  /** The histograms' bytes, after end(). */
  finishedPlanes(): FinishedPlane[] {
    return this.planes.map(([horizontal, plane]) => ({ horizontal, bytes: plane.toBytes() }));
  }
}
