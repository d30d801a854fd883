// What a map draws over its bins: the kinematic edges and the leading-order expectation of lib/physics/plane, for the
// jets' radius and the selection's median pt, as the display settings ask.
import type { DisplaySettings } from '@/lib/maps/entry-settings';
import type { PlaneView } from '@/lib/maps/view-settings';
import type { PlaneAxes } from '@/lib/physics/plane/axes';
import { type EdgeLine, edgeLines } from '@/lib/physics/plane/edges';
import { expectationGrid, expectedDensity } from '@/lib/physics/plane/expectation';
import { contourLines } from '../plane/contour-lines';
import type { FigureContours } from '../plane/plane-figure';
import { formatValue } from '../plane/value-format';

const GRID = 120;
const LEVELS = 5;

export interface Overlays {
  lines: EdgeLine[];
  contours: FigureContours | null;
  /** Words under the figure saying what is drawn and where it comes from. */
  caption: string[];
}

export function overlaysFor(view: PlaneView, display: DisplaySettings, R: number, medianPt: number | null, xRange: [number, number], yRange: [number, number]): Overlays {
  const axes = { x: view.x, y: view.y } as PlaneAxes;
  const caption: string[] = [];
  const { overlays } = display;
  if (medianPt === null || !(medianPt > 0)) return { lines: [], contours: null, caption };
  const pt = medianPt;
  const lines = edgeLines(axes, { R, pt, zValues: [0.1, 0.01] }).filter(
    (line) =>
      (line.kind === 'radius' && overlays.radius) ||
      ((line.kind === 'zHalf' || line.kind === 'constantZ') && overlays.zEdges) ||
      (line.kind === 'ktOneGeV' && overlays.ktBoundary),
  );
  if (lines.length > 0) caption.push(`Lines: ${[overlays.radius && `Δ = R = ${R}`, overlays.zEdges && 'z = ½ (dashed), z = 0.1 and 0.01 (dotted)', overlays.ktBoundary && 'kₜ = 1 GeV'].filter(Boolean).join('; ')}, at the selected jets' median pₜ = ${formatValue(pt)} GeV.`);
  let contours: FigureContours | null = null;
  if (overlays.expectation !== 'none') {
    const settings = { parton: overlays.parton, terms: overlays.expectation, pt, R };
    const values = expectationGrid(axes, xRange, yRange, GRID, GRID, settings);
    // Levels between the lowest and highest values where the expectation is given (not the frozen ones).
    const defined: number[] = [];
    for (let iy = 0; iy < GRID; iy++) {
      for (let ix = 0; ix < GRID; ix++) {
        const value = expectedDensity(axes, xRange[0] + ((ix + 0.5) * (xRange[1] - xRange[0])) / GRID, yRange[0] + ((iy + 0.5) * (yRange[1] - yRange[0])) / GRID, settings);
        if (Number.isFinite(value)) defined.push(value);
      }
    }
    if (defined.length > 0) {
      const low = defined.reduce((a, b) => Math.min(a, b));
      const high = defined.reduce((a, b) => Math.max(a, b));
      const thresholds = Array.from({ length: LEVELS }, (_, k) => low + ((k + 0.5) * (high - low)) / LEVELS);
      const given = (u: number, v: number) => Number.isFinite(expectedDensity(axes, u, v, settings));
      contours = { lines: contourLines(values, GRID, GRID, xRange, yRange, thresholds, given), label: 'leading-order expectation' };
      caption.push(
        `Contours: leading-order expectation for ${overlays.parton} jets (${overlays.expectation === 'softCollinear' ? 'soft-collinear, 2αₛCᵢ/π' : 'with hard-collinear splitting functions'}; one-loop αₛ, αₛ(M_Z) = 0.118; Altarelli–Parisi, Nucl. Phys. B126 (1977) 298) at ${thresholds.map((t) => formatValue(t)).join(', ')}, drawn where it is given: kₜ ≥ 1 GeV, Δ < R, z ≤ ½.`,
      );
      if (view.tree !== 'primary') caption.push('The expectation is that of primary emissions; this view shows other splittings.');
      caption.push('C/A clustering takes soft emissions out of the primary sequence where emissions are dense, so declustered densities sit below this expectation at low kₜ.');
    } else {
      caption.push('The leading-order expectation is not defined anywhere in this range (it needs kₜ ≥ 1 GeV, Δ < R, z ≤ ½).');
    }
  }
  return { lines, contours, caption };
}
