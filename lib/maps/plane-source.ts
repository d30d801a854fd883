// Where a sample's binned plane comes from: the fine primary-plane histogram cached in SQLite when the view allows it
// (primary splittings, ln(1/Δ) or ln(R/Δ) against ln kt, all jets, bins made of whole fine bins), else the stored
// columns through the jet selection. Both give the same numbers for the same bins (tests check this).
import { ApiError } from '@/lib/api/errors';
import { db } from '@/lib/db/connection';
import { PlaneHistogram } from '@/lib/physics/density';
import type { AxisChoice } from '@/lib/physics/plane/axes';
import type { Extent } from '@/lib/physics/plane/bins';
import { type BinnedPlane, fillPlane, type PlaneBins, planeExtents } from '@/lib/physics/plane/binned-plane';
import { alignsWithFine, binnedFromFine, fineExtents } from '@/lib/physics/plane/from-fine';
import type { Sample } from '@/models/sample';
import { type SelectedJets, selectJets } from './jet-selection';
import { Lru, processWide } from './lru';
import { SampleColumns } from './sample-columns';
import { sampleKey } from './sample-key';
import { isDefaultSelection, type PlaneView } from './view-settings';

const histograms = () => processWide('mapFineHistograms', () => new Lru<PlaneHistogram>(64 * 1024 * 1024, (h) => h.sumW.byteLength * 3));
/** Selections by sample and selection: the promise is kept, so that a map's parts asking at once compute it once. */
const selections = () => processWide('mapSelections', () => new Lru<Promise<SelectedJets>>(128));

/** The cached fine histogram of a sample in a horizontal coordinate, decoded once per process. */
export async function fineHistogram(sample: Sample, horizontal: 'lnInvDelta' | 'lnRoverDelta'): Promise<PlaneHistogram> {
  const key = `${sampleKey(sample)}:${horizontal}`;
  const hit = histograms().get(key);
  if (hit) return hit;
  const stored = await db().models.SamplePlane.findOne({ where: { sampleId: sample.id, horizontal } });
  if (!stored) throw new ApiError(500, 'internal', `Sample ${sample.id} has no cached ${horizontal} plane.`);
  const histogram = PlaneHistogram.fromBytes(new Uint8Array(stored.histogram));
  histograms().set(key, histogram);
  return histogram;
}

/** The horizontal coordinate of a fine histogram that can serve this view, or null. */
function fineCoordinate(view: PlaneView): 'lnInvDelta' | 'lnRoverDelta' | null {
  if (view.tree !== 'primary' || view.y.variable !== 'lnKt' || !isDefaultSelection(view.selection)) return null;
  return view.x.variable === 'lnInvDelta' || view.x.variable === 'lnRoverDelta' ? view.x.variable : null;
}

export function sampleColumns(sample: Sample): SampleColumns {
  return new SampleColumns(sample.id, sampleKey(sample), sample.settings.jet.R);
}

/** 409 when the view needs splittings the sample did not store. */
export function requireTree(sample: Sample, view: PlaneView): void {
  if (view.tree !== 'primary' && !sample.settings.fullTree) {
    throw new ApiError(
      409,
      'full_tree_not_stored',
      `Sample ${sample.id} ("${sample.name}") stores only its primary splittings; the ${view.tree === 'secondary' ? 'secondary' : view.tree === 'all' ? 'all-splittings' : 'generation ≥ 2'} plane needs the full C/A tree. Upload the file again with "keep the full tree" to see it.`,
    );
  }
}

/** The selected jets of a view (cached by sample and selection; a failed selection is not kept). */
export function viewJets(sample: Sample, view: PlaneView): Promise<SelectedJets> {
  const key = `${sampleKey(sample)}:${JSON.stringify(view.selection)}`;
  const hit = selections().get(key);
  if (hit) return hit;
  const jets = selectJets(sampleColumns(sample), view.selection);
  selections().set(key, jets);
  jets.catch(() => selections().delete(key));
  return jets;
}

/** The view's splitting coordinates, their jets, tree membership and the jets' weights (from the stored columns). */
export async function membersAndCoordinates(sample: Sample, view: Pick<PlaneView, 'tree' | 'x' | 'y'>) {
  const data = sampleColumns(sample);
  const [xs, ys, jetRow, member, jetWeight] = await Promise.all([
    data.coordinate(view.x as AxisChoice),
    data.coordinate(view.y as AxisChoice),
    data.splitting('jetRow'),
    data.members(view.tree, sample.settings.fullTree ? 'full' : 'primary'),
    data.jet('weight'),
  ]);
  return { xs, ys, jetRow, member, jetWeight };
}

/** Where the view's splittings are: quantile extents of both coordinates (for fitted ranges). */
export async function viewExtents(sample: Sample, view: PlaneView): Promise<{ x: Extent | null; y: Extent | null }> {
  const fine = fineCoordinate(view);
  if (fine) return fineExtents(await fineHistogram(sample, fine));
  const jets = await viewJets(sample, view);
  return planeExtents({ ...(await membersAndCoordinates(sample, view)), selected: jets.selected });
}

/** The view's splittings counted on these bins, and where they came from. */
export async function viewPlane(sample: Sample, view: PlaneView, bins: PlaneBins): Promise<{ plane: BinnedPlane; source: 'cache' | 'columns' }> {
  const fine = fineCoordinate(view);
  if (fine) {
    const histogram = await fineHistogram(sample, fine);
    if (alignsWithFine(histogram, bins)) return { plane: binnedFromFine(histogram, bins), source: 'cache' };
  }
  const jets = await viewJets(sample, view);
  const source = await membersAndCoordinates(sample, view);
  return { plane: fillPlane(bins, { ...source, selected: jets.selected }), source: 'columns' };
}
