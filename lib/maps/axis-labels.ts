// Names of plane coordinates: typeset for the interface (Δ, κ, subscripts as Unicode) and ASCII for files and the API.
import type { AxisChoice, PlaneVariable, TreeChoice } from '@/lib/physics/plane/axes';

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
export function axisLabel(axis: AxisChoice): string {
  return logged(axis, SCREEN[axis.variable]);
}

export function axisAscii(axis: AxisChoice): string {
  return logged(axis, ASCII[axis.variable]);
}

export const TREE_LABELS: Record<TreeChoice, string> = {
  primary: 'primary splittings',
  secondary: 'secondary splittings (generation 2)',
  fromSecond: 'splittings of generation 2 and above',
  all: 'all splittings',
};

/** The density's unit in words: per jet, per unit of both coordinates. */
export function densityLabel(x: AxisChoice, y: AxisChoice, ascii = false): string {
  const name = ascii ? axisAscii : axisLabel;
  return `splittings per jet per unit ${name(x)} per unit ${name(y)}`;
}
