// The fine primary-plane histograms of a stored column set, filled as SampleSink fills them while processing:
// every jet's weight in jet order, then every primary splitting with its jet's weight in splitting order. Each
// bin receives the same values in the same order as in one processing run, so the histograms of a merged
// (sharded) sample are bit for bit those of the embedded run.
import type { ColumnReader } from '@/lib/ingest/columns';
import type { FinishedPlane } from './messages';
import { samplePlanes } from './sample-sink';

/** Rows read at once. */
const CHUNK_ROWS = 1 << 20;

export async function planesFromColumns(reader: ColumnReader, R: number): Promise<FinishedPlane[]> {
  const planes = samplePlanes(R);
  const { jets, splittings } = reader.manifest;
  const weights = await reader.jetColumn('weight');
  for (let j = 0; j < jets.rows; j++) for (const [, plane] of planes) plane.addJet(weights[j]);
  const primaryOnly = reader.manifest.tree === 'full';
  for (let first = 0; first < splittings.rows; first += CHUNK_ROWS) {
    const count = Math.min(CHUNK_ROWS, splittings.rows - first);
    const [jetRow, generation, x, y] = await Promise.all([
      reader.splittingColumnRange('jetRow', first, count),
      reader.splittingColumnRange('generation', first, count),
      reader.splittingColumnRange('lnInvDelta', first, count),
      reader.splittingColumnRange('lnKt', first, count),
    ]);
    for (let k = 0; k < count; k++) {
      if (primaryOnly && generation[k] !== 1) continue;
      for (const [, plane] of planes) plane.fillEmission(x[k], y[k], weights[jetRow[k]]);
    }
  }
  return planes.map(([horizontal, plane]) => ({ horizontal, bytes: plane.toBytes() }));
}
