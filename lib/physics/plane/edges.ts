// Kinematic lines worth drawing on a plane (PHYSICS.md "Kinematic edges"): the jet radius Δ = R, the z = 1/2 edge
// and lines of constant z (kt = z pt Δ at the jets' pt), and the kt = 1 GeV boundary below which the leading-order
// expectation stops. Each is a polyline in the plane's coordinates, made by walking Δ (or z) and mapping with axes.ts.
import { type PlaneAxes, coordinate } from './axes';

export type EdgeKind = 'radius' | 'zHalf' | 'constantZ' | 'ktOneGeV';

export interface EdgeLine {
  kind: EdgeKind;
  /** ASCII label, e.g. "z = 0.1". */
  label: string;
  points: Array<[number, number]>;
}

export interface EdgeSettings {
  R: number;
  /** The jets' transverse momentum (GeV): the selection's median in a map. */
  pt: number;
  /** Values of z for the constant-z lines. */
  zValues: readonly number[];
}

const STEPS = 160;
/** How far below the jet radius the lines run: Δ down to R e^−DEPTH. */
const DEPTH = 14;
const KT_BOUNDARY = 1;

function finitePoints(points: Array<[number, number]>): Array<[number, number]> {
  return points.filter(([u, v]) => Number.isFinite(u) && Number.isFinite(v));
}

/** Along Δ from R down, at the z that `zOf(Δ)` gives, only where 0 < z ≤ 1/2. */
function alongDelta(axes: PlaneAxes, s: EdgeSettings, zOf: (delta: number) => number): Array<[number, number]> {
  const points: Array<[number, number]> = [];
  for (let k = 0; k <= STEPS; k++) {
    const delta = s.R * Math.exp((-DEPTH * k) / STEPS);
    const z = zOf(delta);
    if (!(z > 0 && z <= 0.5)) continue;
    points.push([coordinate(axes.x, delta, z, z * s.pt * delta, s.R), coordinate(axes.y, delta, z, z * s.pt * delta, s.R)]);
  }
  return finitePoints(points);
}

export function edgeLines(axes: PlaneAxes, s: EdgeSettings): EdgeLine[] {
  const radius: Array<[number, number]> = [];
  for (let k = 0; k <= STEPS; k++) {
    const z = 0.5 * Math.exp((-DEPTH * k) / STEPS);
    radius.push([coordinate(axes.x, s.R, z, z * s.pt * s.R, s.R), coordinate(axes.y, s.R, z, z * s.pt * s.R, s.R)]);
  }
  return [
    { kind: 'radius', label: `Delta = R = ${s.R}`, points: finitePoints(radius) },
    { kind: 'zHalf', label: 'z = 1/2', points: alongDelta(axes, s, () => 0.5) },
    ...s.zValues.map((zValue) => ({ kind: 'constantZ' as const, label: `z = ${zValue}`, points: alongDelta(axes, s, () => zValue) })),
    { kind: 'ktOneGeV', label: 'kt = 1 GeV', points: alongDelta(axes, s, (delta) => KT_BOUNDARY / (s.pt * delta)) },
  ];
}
