// The live numbers of a region in a view: for every sample shown, splittings per jet inside the region (∫ρ) with
// its error, and each later sample over the first with the error of the ratio (lib/physics/plane/region.ts).
import { densityGrid } from '@/lib/maps/plane-grid';
import type { PlaneData, SampleRef } from '@/lib/maps/shapes';
import { regionIntegral, regionRatio, type RegionIntegral, type RegionShape } from '@/lib/physics/plane/region';

/** One sample's plane in the view. */
export interface RegionPlane {
  sample: Pick<SampleRef, 'id' | 'name' | 'label'>;
  plane: PlaneData;
}

export interface RegionNumbers {
  integrals: Array<{ sample: RegionPlane['sample']; integral: RegionIntegral }>;
  /** Each later sample over the first. */
  ratios: Array<{ sample: RegionPlane['sample']; reference: RegionPlane['sample']; value: number; error: number }>;
  /** Fraction of the region inside the shown bins (the same for every sample: they share the bins). */
  covered: number;
}

export function regionNumbers(shape: RegionShape, planes: readonly RegionPlane[]): RegionNumbers {
  const integrals = planes.map((p) => ({ sample: p.sample, integral: regionIntegral(densityGrid(p.plane), shape) }));
  const [first, ...others] = integrals;
  return {
    integrals,
    ratios: first ? others.map((o) => ({ sample: o.sample, reference: first.sample, ...regionRatio(first.integral, o.integral) })) : [],
    covered: first?.integral.covered ?? 0,
  };
}
