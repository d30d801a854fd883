// The coordinates a splitting can be drawn in (PHYSICS.md "Declustering and the emission plane"; the plane of
// arXiv:1807.04758): horizontal ln(1/Δ), ln(R/Δ) or Δ; vertical ln(kt/GeV), ln(1/z), ln κ (κ = zΔ), z or kt. Δ, z and
// kt may be binned on a log scale, in which case the binned coordinate is their natural logarithm.
//
// At fixed jet pt, kt = z pt Δ: every coordinate is a function of (Δ, z), which is how overlays and the
// leading-order expectation are mapped onto any plane.

export const HORIZONTAL_VARIABLES = ['lnInvDelta', 'lnRoverDelta', 'delta'] as const;
export const VERTICAL_VARIABLES = ['lnKt', 'lnInvZ', 'lnKappa', 'z', 'kt'] as const;
export type HorizontalVariable = (typeof HORIZONTAL_VARIABLES)[number];
export type VerticalVariable = (typeof VERTICAL_VARIABLES)[number];
export type PlaneVariable = HorizontalVariable | VerticalVariable;

/** Variables that are plain quantities (not logarithms) and so may be binned on a linear or a log scale. */
export const SCALABLE_VARIABLES: readonly PlaneVariable[] = ['delta', 'z', 'kt'];

export interface AxisChoice<V extends PlaneVariable = PlaneVariable> {
  variable: V;
  /** Bin ln(variable) (only for delta, z, kt; the logarithmic variables ignore it). */
  log: boolean;
}

export interface PlaneAxes {
  x: AxisChoice<HorizontalVariable>;
  y: AxisChoice<VerticalVariable>;
}

/** Which splittings a plane holds: the primary sequence (generation 1), the secondary (2), 2 and up, or all. */
export const TREE_CHOICES = ['primary', 'secondary', 'fromSecond', 'all'] as const;
export type TreeChoice = (typeof TREE_CHOICES)[number];

/** Whether a splitting of this generation belongs to the plane. */
export function inTree(tree: TreeChoice, generation: number): boolean {
  if (tree === 'primary') return generation === 1;
  if (tree === 'secondary') return generation === 2;
  if (tree === 'fromSecond') return generation >= 2;
  return true;
}

export function isLogBinned(axis: AxisChoice): boolean {
  return axis.log && SCALABLE_VARIABLES.includes(axis.variable);
}

/**
 * The binned coordinate of a splitting with opening angle Δ, softer fraction z and kt (GeV); R is the jet
 * radius (for ln(R/Δ)). Δ = 0 gives +∞ for ln(1/Δ) and ln(R/Δ), which no bin holds.
 */
export function coordinate(axis: AxisChoice, delta: number, z: number, kt: number, R: number): number {
  switch (axis.variable) {
    case 'lnInvDelta':
      return -Math.log(delta);
    case 'lnRoverDelta':
      return Math.log(R / delta);
    case 'lnKt':
      return Math.log(kt);
    case 'lnInvZ':
      return -Math.log(z);
    case 'lnKappa':
      return Math.log(z * delta);
    case 'delta':
      return axis.log ? Math.log(delta) : delta;
    case 'z':
      return axis.log ? Math.log(z) : z;
    case 'kt':
      return axis.log ? Math.log(kt) : kt;
  }
}

/** Δ at a horizontal coordinate u (inverse of `coordinate`). */
export function deltaAt(axis: AxisChoice<HorizontalVariable>, u: number, R: number): number {
  if (axis.variable === 'lnInvDelta') return Math.exp(-u);
  if (axis.variable === 'lnRoverDelta') return R * Math.exp(-u);
  return axis.log ? Math.exp(u) : u;
}

/** z at a vertical coordinate v for a splitting of angle Δ in a jet of transverse momentum pt (kt = z pt Δ). */
export function zAt(axis: AxisChoice<VerticalVariable>, v: number, delta: number, pt: number): number {
  switch (axis.variable) {
    case 'lnKt':
      return Math.exp(v) / (pt * delta);
    case 'lnInvZ':
      return Math.exp(-v);
    case 'lnKappa':
      return Math.exp(v) / delta;
    case 'z':
      return axis.log ? Math.exp(v) : v;
    case 'kt':
      return (axis.log ? Math.exp(v) : v) / (pt * delta);
  }
}

/**
 * |d ln Δ / du| · |d ln kt / dv| at a point: a density per unit ln(1/Δ) and ln kt times this is the density per unit
 * of the plane's coordinates (u, v). The map (ln Δ, ln kt) → (u, v) is triangular at fixed pt (u depends on Δ only,
 * and v on ln kt up to a function of Δ), so the Jacobian is this product.
 */
export function jacobianFromLnPlane(axes: PlaneAxes, delta: number, z: number, kt: number): number {
  const horizontal = axes.x.variable === 'delta' && !axes.x.log ? 1 / delta : 1;
  let vertical = 1;
  if (axes.y.variable === 'z' && !axes.y.log) vertical = 1 / z;
  else if (axes.y.variable === 'kt' && !axes.y.log) vertical = 1 / kt;
  return horizontal * vertical;
}
