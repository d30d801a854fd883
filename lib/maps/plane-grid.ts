// A plane as the API sends it (PlaneData: errors, not variances) turned back into the DensityGrid the plane
// functions take, so that pages compute box and region numbers with the same code as the server.
import type { DensityGrid } from '@/lib/physics/plane/binned-plane';
import type { PlaneData } from './shapes';

export function densityGrid(plane: PlaneData): DensityGrid {
  return {
    xEdges: Float64Array.from(plane.xEdges),
    yEdges: Float64Array.from(plane.yEdges),
    density: Float64Array.from(plane.density),
    variance: Float64Array.from(plane.error, (e) => e * e),
    count: plane.count ? Float64Array.from(plane.count) : null,
    jetWeight: 1,
    jetCount: 1,
    outsidePerJet: 0,
    splittingsPerJet: 0,
  };
}
