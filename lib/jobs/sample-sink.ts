// Where a job's pipeline puts its results: the binary columns of the sample (committed into place only at the end)
// and the fine primary-plane histograms in both horizontal coordinates, for the cache in SQLite.
import { ColumnWriter } from '@/lib/ingest/columns';
import { IngestError } from '@/lib/ingest/errors';
import type { IngestHeader } from '@/lib/ingest/header';
import type { RecordMeta, ResultSink } from '@/lib/ingest/pipeline/sink';
import { defaultGrid, PlaneHistogram } from '@/lib/physics/density';
import type { ProcessSettings, RecordResult } from '@/lib/physics/types';
import type { FinishedPlane } from './messages';

/** The fine primary-plane histograms a sample keeps, in both horizontal coordinates. */
export function samplePlanes(R: number): Array<[FinishedPlane['horizontal'], PlaneHistogram]> {
  return [
    ['lnInvDelta', new PlaneHistogram(defaultGrid('lnInvDelta'))],
    ['lnRoverDelta', new PlaneHistogram(defaultGrid('lnRoverDelta', R))],
  ];
}

export class SampleSink implements ResultSink {
  private columns: ColumnWriter | null = null;
  private planes: Array<[FinishedPlane['horizontal'], PlaneHistogram]> = [];
  private records = 0;

  /** `onBegin` hears the input's header before the first record; a sample holds at most `maxRecords` records. */
  constructor(
    private readonly sampleDir: string,
    private readonly onBegin: (header: IngestHeader) => void,
    private readonly maxRecords = Infinity,
  ) {}

  async begin(header: IngestHeader, settings: ProcessSettings): Promise<void> {
    this.onBegin(header);
    this.planes = samplePlanes(settings.jet.R);
    this.columns = await ColumnWriter.create(this.sampleDir, { tree: settings.fullTree ? 'full' : 'primary' });
  }

  async write(records: RecordMeta[], results: RecordResult[]): Promise<void> {
    if (this.records + records.length > this.maxRecords) {
      const first = records[this.maxRecords - this.records];
      throw new IngestError(`the file has more than ${this.maxRecords} records, the most one sample may hold on this server`, {
        line: first.line,
        code: 'limit',
      });
    }
    this.records += records.length;
    const planes = this.planes;
    for (let r = 0; r < records.length; r++) {
      const jets = results[r].jets, weight = records[r].weight;
      for (let j = 0; j < jets.length; j++) {
        for (let p = 0; p < planes.length; p++) planes[p][1].fillJet(jets[j].primary, weight);
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
