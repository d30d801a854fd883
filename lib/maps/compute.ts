// Maps, contrasts and projections of done samples, with results kept by (samples, settings) in a process-wide cache
// so that a study page that asks again is answered from memory.
import { badRequest } from '@/lib/api/errors';
import { type BinnedPlane, densityOf, type DensityGrid, type PlaneBins } from '@/lib/physics/plane/binned-plane';
import { unionExtent } from '@/lib/physics/plane/bins';
import { chiSquare, contrastGrid, type ContrastMode } from '@/lib/physics/plane/compare';
import { project, projectionRatio, type ProjectionAxis } from '@/lib/physics/plane/projection';
import { requireDone } from '@/lib/samples/done-sample';
import type { Sample } from '@/models/sample';
import { FilterError, type SelectedJets } from './jet-selection';
import { jetSummary } from './jet-summary';
import { Lru, processWide } from './lru';
import { requireTree, sampleColumns, viewExtents, viewJets, viewPlane } from './plane-source';
import { requireJets, resolveBins } from './resolve-bins';
import { sampleKey } from './sample-key';
import { sampleRef } from './sample-ref';
import type { ContrastResult, JsonNumber, MapResult, PlaneData, ProjectionResult, SamplePlane } from './shapes';
import { planeViewKey, type PlaneView } from './view-settings';

const results = () => processWide('mapResults', () => new Lru<Promise<unknown>>(300));

/** The cached result under `key`, computing it once (a failed computation is not kept). */
export function remembered<T>(key: string, compute: () => Promise<T>): Promise<T> {
  const cache = results();
  const hit = cache.get(key) as Promise<T> | undefined;
  if (hit) return hit;
  const promise = compute();
  cache.set(key, promise);
  promise.catch(() => cache.delete(key));
  return promise;
}

export const finiteOrNull = (v: number): JsonNumber => (Number.isFinite(v) ? v : null);

export function planeData(grid: DensityGrid): PlaneData {
  return {
    xEdges: Array.from(grid.xEdges),
    yEdges: Array.from(grid.yEdges),
    density: Array.from(grid.density),
    error: Array.from(grid.variance, Math.sqrt),
    count: grid.count ? Array.from(grid.count) : null,
  };
}

/** Turns a refused filter into a 400 that names the expression field. */
export async function withFilterField<T>(work: () => Promise<T>): Promise<T> {
  try {
    return await work();
  } catch (error) {
    if (error instanceof FilterError) throw badRequest(error.message, [{ path: 'view.selection.filter', message: error.message }]);
    throw error;
  }
}

function samplePlane(sample: Sample, jets: SelectedJets, plane: BinnedPlane, source: 'cache' | 'columns'): { view: SamplePlane; grid: DensityGrid } {
  requireJets(plane.jetWeight, `sample ${sample.id} ("${sample.name}")`);
  const grid = densityOf(plane);
  const perJet = (w: number) => w / plane.jetWeight;
  return {
    grid,
    view: {
      sample: sampleRef(sample),
      plane: planeData(grid),
      jets: { stored: jets.stored, selected: jets.count, weight: jets.weight, rejected: jets.rejected, medianPt: finiteOrNull(jets.medianPt) },
      outside: {
        perJet: grid.outsidePerJet,
        count: plane.outsideCount,
        left: perJet(plane.outside.left),
        right: perJet(plane.outside.right),
        below: perJet(plane.outside.below),
        above: perJet(plane.outside.above),
        undefined: perJet(plane.outside.undefined),
      },
      splittingsPerJet: grid.splittingsPerJet,
      source,
    },
  };
}

async function planeOn(sample: Sample, view: PlaneView, bins: PlaneBins) {
  const [jets, { plane, source }] = await Promise.all([viewJets(sample, view), viewPlane(sample, view, bins)]);
  return samplePlane(sample, jets, plane, source);
}

/** Bins for several samples at once: the user's, or fitted to all of them together. */
export async function sharedBins(samples: Sample[], view: PlaneView): Promise<PlaneBins> {
  const { x, y } = view.bins;
  // Ranges given on both axes: nothing to fit, so no pass over the splittings to find where they are.
  if (x.min !== null && x.max !== null && y.min !== null && y.max !== null) return resolveBins(view, { x: null, y: null });
  let extents = { x: null, y: null } as Awaited<ReturnType<typeof viewExtents>>;
  for (const sample of samples) {
    const e = await viewExtents(sample, view);
    extents = { x: unionExtent(extents.x, e.x), y: unionExtent(extents.y, e.y) };
  }
  return resolveBins(view, extents);
}

export function checkedSamples(samples: Sample[], view: PlaneView): void {
  for (const sample of samples) {
    requireDone(sample);
    requireTree(sample, view);
  }
}

export function computeMap(sample: Sample, view: PlaneView): Promise<MapResult> {
  checkedSamples([sample], view);
  return remembered(`map:${sampleKey(sample)}:${planeViewKey(view)}`, () =>
    withFilterField(async () => {
      const bins = await sharedBins([sample], view);
      const { view: shown } = await planeOn(sample, view, bins);
      // The summary depends on the jets only, not on the plane or its bins.
      const summary = await remembered(`summary:${sampleKey(sample)}:${JSON.stringify(view.selection)}`, async () =>
        jetSummary(sampleColumns(sample), await viewJets(sample, view)),
      );
      return { ...shown, view, bins, summary };
    }),
  );
}

export interface ContrastOptions {
  mode: ContrastMode;
  minEntries: number;
}

export function computeContrast(samples: Sample[], view: PlaneView, options: ContrastOptions): Promise<ContrastResult> {
  checkedSamples(samples, view);
  const key = `contrast:${samples.map(sampleKey).join(',')}:${options.mode}:${options.minEntries}:${planeViewKey(view)}`;
  return remembered(key, () =>
    withFilterField(async () => {
      const bins = await sharedBins(samples, view);
      const planes = [];
      for (const sample of samples) planes.push(await planeOn(sample, view, bins));
      const [reference, ...others] = planes;
      const comparisons = others.map((other) => {
        const grid = contrastGrid(reference.grid, other.grid, options.mode, options.minEntries);
        const { chi2, ndf } = chiSquare(reference.grid, other.grid, grid.masked);
        return {
          reference: reference.view.sample.id,
          sample: other.view.sample.id,
          mode: options.mode,
          value: Array.from(grid.value, finiteOrNull),
          error: Array.from(grid.variance, (v) => finiteOrNull(Math.sqrt(v))),
          masked: Array.from(grid.masked),
          chi2,
          ndf,
        };
      });
      return { view, bins, mode: options.mode, minEntries: options.minEntries, inputs: planes.map((p) => p.view), comparisons };
    }),
  );
}

export interface ProjectionOptions {
  onto: ProjectionAxis;
  /** Slice of the other coordinate; null: its whole range. */
  from: number | null;
  to: number | null;
}

export function computeProjection(samples: Sample[], view: PlaneView, options: ProjectionOptions): Promise<ProjectionResult> {
  checkedSamples(samples, view);
  const key = `projection:${samples.map(sampleKey).join(',')}:${options.onto}:${options.from}:${options.to}:${planeViewKey(view)}`;
  return remembered(key, () =>
    withFilterField(async () => {
      const bins = await sharedBins(samples, view);
      const other = options.onto === 'x' ? bins.y : bins.x;
      const from = options.from ?? other.min;
      const to = options.to ?? other.max;
      const series = [];
      for (const sample of samples) {
        const { grid, view: shown } = await planeOn(sample, view, bins);
        let projection;
        try {
          projection = project(grid, options.onto, from, to);
        } catch (error) {
          if (error instanceof RangeError) throw badRequest(`Invalid projection: ${error.message}.`, [{ path: 'from', message: error.message }]);
          throw error;
        }
        series.push({ projection, shown });
      }
      const [first] = series;
      return {
        view,
        bins,
        onto: options.onto,
        slice: first.projection.slice,
        edges: Array.from(first.projection.edges),
        series: series.map(({ projection, shown }) => ({
          sample: shown.sample,
          density: Array.from(projection.density),
          error: Array.from(projection.variance, Math.sqrt),
          medianPt: shown.jets.medianPt,
          jetWeight: projection.jetWeight,
        })),
        ratios: series.slice(1).map(({ projection, shown }) => {
          const r = projectionRatio(first.projection, projection);
          return { reference: first.shown.sample.id, sample: shown.sample.id, value: Array.from(r.value, finiteOrNull), error: Array.from(r.variance, (v) => finiteOrNull(Math.sqrt(v))) };
        }),
      };
    }),
  );
}
