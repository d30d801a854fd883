// The leading-order emission density of lo-density.ts drawn on any plane (PHYSICS.md "Leading-order expectation"):
// per unit ln(1/Δ) and ln kt it is 2 α_s(kt) C_i / π (soft-collinear) or (α_s(kt)/π) z P(z) (with the hard-collinear
// terms); on other coordinates it is multiplied by the Jacobian of axes.ts. It is given inside the region of a
// single emission off the jet's leading parton: Δ < R, z ≤ 1/2, and kt ≥ 1 GeV (below that the expectation stops,
// running-coupling.ts); elsewhere NaN.
import { hardCollinearDensity, type Parton, softCollinearDensity } from '../lo-density';
import { isPerturbative, PERTURBATIVE_KT_MIN } from '../running-coupling';
import { type AxisChoice, deltaAt, type HorizontalVariable, jacobianFromLnPlane, type PlaneAxes, type VerticalVariable, zAt } from './axes';
import { binsInside } from './projection';

export type ExpectationTerms = 'softCollinear' | 'hardCollinear';

export interface ExpectationSettings {
  parton: Parton;
  terms: ExpectationTerms;
  /** The jets' transverse momentum (GeV): the selection's median in a map. */
  pt: number;
  /** Jet radius. */
  R: number;
}

/** Expected density per unit of the plane's coordinates at (u, v), or NaN outside the region where it is given. */
export function expectedDensity(axes: PlaneAxes, u: number, v: number, s: ExpectationSettings): number {
  const delta = deltaAt(axes.x as AxisChoice<HorizontalVariable>, u, s.R);
  const z = zAt(axes.y as AxisChoice<VerticalVariable>, v, delta, s.pt);
  const kt = z * s.pt * delta;
  if (!(delta > 0 && delta < s.R && z > 0 && z <= 0.5) || !isPerturbative(kt)) return Number.NaN;
  const perLn = s.terms === 'softCollinear' ? softCollinearDensity(s.parton, kt) : hardCollinearDensity(s.parton, z, kt);
  return perLn * jacobianFromLnPlane(axes, delta, z, kt);
}

/**
 * The expectation as a continuous field for contour lines: α_s frozen below kt = 1 GeV and the density held at its
 * value on the z = 1/2 and Δ = R edges beyond them, so that marching squares finds no false lines along those edges;
 * the lines are then drawn only where the expectation is given (expectedDensity). The plane's Jacobian is that of
 * the point itself.
 */
export function expectedField(axes: PlaneAxes, u: number, v: number, s: ExpectationSettings): number {
  const delta = deltaAt(axes.x as AxisChoice<HorizontalVariable>, u, s.R);
  const z = zAt(axes.y as AxisChoice<VerticalVariable>, v, delta, s.pt);
  if (!(delta > 0 && z > 0) || !Number.isFinite(delta) || !Number.isFinite(z)) return Number.NaN;
  const heldDelta = Math.min(delta, s.R);
  const heldZ = Math.min(z, 0.5);
  const kt = Math.max(PERTURBATIVE_KT_MIN, heldZ * s.pt * heldDelta);
  const perLn = s.terms === 'softCollinear' ? softCollinearDensity(s.parton, kt) : hardCollinearDensity(s.parton, heldZ, kt);
  return perLn * jacobianFromLnPlane(axes, delta, z, z * s.pt * delta);
}

/** The contour field of expectedField sampled on a regular grid of `nx` × `ny` cell centres over the given ranges. */
export function expectationGrid(
  axes: PlaneAxes,
  x: [number, number],
  y: [number, number],
  nx: number,
  ny: number,
  s: ExpectationSettings,
): Float64Array {
  const values = new Float64Array(nx * ny);
  for (let iy = 0; iy < ny; iy++) {
    const v = y[0] + ((iy + 0.5) * (y[1] - y[0])) / ny;
    for (let ix = 0; ix < nx; ix++) values[iy * nx + ix] = expectedField(axes, x[0] + ((ix + 0.5) * (x[1] - x[0])) / nx, v, s);
  }
  return values;
}

/** Points per bin and per slice bin of the midpoint rule in expectedProjection. */
const SUBDIVISIONS = 16;

/**
 * The expectation projected as a measured projection is: per unit of the `onto` coordinate, integrated over the
 * slice bins [from, to] of the other one (`otherEdges` are the map's bins there), averaged over each bin of
 * `edges`; midpoint rule, NaN where the region where the expectation is given is not reached at all.
 */
export function expectedProjection(
  axes: PlaneAxes,
  onto: 'x' | 'y',
  edges: ArrayLike<number>,
  otherEdges: ArrayLike<number>,
  from: number,
  to: number,
  s: ExpectationSettings,
): Float64Array {
  const [first, end] = binsInside(otherEdges, from, to);
  const lo = otherEdges[first];
  const hi = otherEdges[end];
  const steps = SUBDIVISIONS * Math.max(1, end - first);
  const out = new Float64Array(edges.length - 1);
  for (let i = 0; i < out.length; i++) {
    let sum = 0;
    let defined = false;
    for (let a = 0; a < SUBDIVISIONS; a++) {
      const p = edges[i] + ((a + 0.5) * (edges[i + 1] - edges[i])) / SUBDIVISIONS;
      for (let b = 0; b < steps; b++) {
        const q = lo + ((b + 0.5) * (hi - lo)) / steps;
        const value = onto === 'x' ? expectedDensity(axes, p, q, s) : expectedDensity(axes, q, p, s);
        if (Number.isNaN(value)) continue;
        defined = true;
        sum += (value * (hi - lo)) / steps;
      }
    }
    out[i] = defined ? sum / SUBDIVISIONS : Number.NaN;
  }
  return out;
}
