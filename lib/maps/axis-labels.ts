// Names of plane coordinates: typeset for the interface (Δ, κ, subscripts as Unicode) and ASCII for files and the API.
// e+e− samples are declustered in the opening angle θ with kₜ = E sin θ (PHYSICS.md "Lepton-collider events"): the
// same slots of the plane, named for what they hold.
import type { AxisChoice, PlaneVariable, TreeChoice } from '@/lib/physics/plane/axes';

export type Collision = 'hadron' | 'ee';

const SCREEN: Record<PlaneVariable, string> = {
  lnInvDelta: 'ln(1/Δ)',
  lnRoverDelta: 'ln(R/Δ)',
  lnKt: 'ln(kₜ/GeV)',
  lnInvZ: 'ln(1/z)',
  lnKappa: 'ln κ',
  delta: 'Δ',
  z: 'z',
  kt: 'kₜ/GeV',
};

const SCREEN_EE: Partial<Record<PlaneVariable, string>> = {
  lnInvDelta: 'ln(1/θ)',
  lnRoverDelta: 'ln(R/θ)',
  lnKt: 'ln(kₜ/GeV), kₜ = E sin θ',
  delta: 'θ',
  kt: 'kₜ/GeV, kₜ = E sin θ',
};

const ASCII_EE: Partial<Record<PlaneVariable, string>> = {
  lnInvDelta: 'ln(1/theta)',
  lnRoverDelta: 'ln(R/theta)',
  lnKt: 'ln(kt/GeV), kt = E sin(theta)',
  delta: 'theta',
  kt: 'kt/GeV, kt = E sin(theta)',
};

const ASCII: Record<PlaneVariable, string> = {
  lnInvDelta: 'ln(1/Delta)',
  lnRoverDelta: 'ln(R/Delta)',
  lnKt: 'ln(kt/GeV)',
  lnInvZ: 'ln(1/z)',
  lnKappa: 'ln(kappa)',
  delta: 'Delta',
  z: 'z',
  kt: 'kt/GeV',
};

const logged = (axis: AxisChoice, name: string) => (axis.log && ['delta', 'z', 'kt'].includes(axis.variable) ? `ln ${name.includes('/') ? `(${name})` : name}` : name);

/** The binned coordinate's name on screen, e.g. "ln(kₜ/GeV)" or "ln Δ" for Δ on a log scale. */
export function axisLabel(axis: AxisChoice, collision: Collision = 'hadron'): string {
  return logged(axis, (collision === 'ee' && SCREEN_EE[axis.variable]) || SCREEN[axis.variable]);
}

export function axisAscii(axis: AxisChoice, collision: Collision = 'hadron'): string {
  return logged(axis, (collision === 'ee' && ASCII_EE[axis.variable]) || ASCII[axis.variable]);
}

export const TREE_LABELS: Record<TreeChoice, string> = {
  primary: 'primary splittings',
  secondary: 'secondary splittings (generation 2)',
  fromSecond: 'splittings of generation 2 and above',
  all: 'all splittings',
};

/** The density's unit in words: per jet, per unit of both coordinates. */
export function densityLabel(x: AxisChoice, y: AxisChoice, ascii = false, collision: Collision = 'hadron'): string {
  const name = ascii ? axisAscii : axisLabel;
  return `splittings per jet per unit ${name(x, collision)} per unit ${name(y, collision)}`;
}
