// GET …/plane: a done sample's primary-plane density rebinned from the fine histogram cached in SQLite.
import { z } from 'zod';
import { ApiError, badRequest } from '@/lib/api/errors';
import { db } from '@/lib/db/connection';
import { DEFAULT_X_AXIS, DEFAULT_Y_AXIS, PlaneHistogram } from '@/lib/physics/density';
import type { Sample } from '@/models/sample';
import { requireDone } from './done-sample';
import { numberParam, wholeNumberParam } from './query-params';
import type { PlaneView } from './shapes';

/** Fine bins merged into one shown bin when the query does not say: 0.2 × 0.2 in (ln 1/Δ, ln kt). */
const DEFAULT_MERGE = 4;

export const planeQuery = z.strictObject({
  horizontal: z
    .enum(['lnInvDelta', 'lnRoverDelta'], { error: 'horizontal must be lnInvDelta or lnRoverDelta' })
    .default('lnInvDelta'),
  xmin: numberParam('xmin').default(DEFAULT_X_AXIS.min),
  xmax: numberParam('xmax').default(DEFAULT_X_AXIS.max),
  xmerge: wholeNumberParam('xmerge', 1, DEFAULT_X_AXIS.bins).default(DEFAULT_MERGE),
  ymin: numberParam('ymin').default(DEFAULT_Y_AXIS.min),
  ymax: numberParam('ymax').default(DEFAULT_Y_AXIS.max),
  ymerge: wholeNumberParam('ymerge', 1, DEFAULT_Y_AXIS.bins).default(DEFAULT_MERGE),
});

export type PlaneQuery = z.output<typeof planeQuery>;

export async function samplePlane(sample: Sample, query: PlaneQuery): Promise<PlaneView> {
  requireDone(sample);
  const stored = await db().models.SamplePlane.findOne({ where: { sampleId: sample.id, horizontal: query.horizontal } });
  if (!stored) throw new ApiError(500, 'internal', `Sample ${sample.id} has no cached ${query.horizontal} plane.`);
  const histogram = PlaneHistogram.fromBytes(new Uint8Array(stored.histogram));
  if (!(histogram.jetWeight > 0)) {
    throw new ApiError(409, 'no_jets', `Sample ${sample.id} has no selected jets (N_jet = ${histogram.jetWeight}): no density to show.`);
  }
  let map;
  try {
    map = histogram.rebin(
      { min: query.xmin, max: query.xmax, merge: query.xmerge },
      { min: query.ymin, max: query.ymax, merge: query.ymerge },
    );
  } catch (error) {
    if (error instanceof RangeError) throw badRequest(`Invalid query: ${error.message}.`, [{ path: '(query)', message: error.message }]);
    throw error;
  }
  return {
    horizontal: query.horizontal,
    xEdges: Array.from(map.xEdges),
    yEdges: Array.from(map.yEdges),
    density: Array.from(map.density),
    variance: Array.from(map.variance),
    jetWeight: map.jetWeight,
    jetCount: histogram.jetCount,
  };
}
