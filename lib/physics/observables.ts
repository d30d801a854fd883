// Jet observables derived from the declustering (PHYSICS.md "Derived jet observables from the same tree").

import type { SoftDropResult, SoftDropSettings } from './types';
import { SPLIT_STRIDE, S_DELTA, S_KT, S_M, S_Z } from './types';

/**
 * SoftDrop ("Soft Drop", JHEP 05 (2014) 146, arXiv:1402.2657) on the primary sequence `primary` (count
 * splittings of SPLIT_STRIDE doubles, root first): the first splitting j → a, b with z > z_cut (Δ/R0)^β stops
 * the grooming, and the groomed jet is that j, i.e. the node a+b at which it stops: m_g = m_{a+b}, z_g = z,
 * R_g = Δ of that splitting. When no splitting passes (or the jet is one particle), the two modes of the paper
 * differ: grooming (the default) leaves the single constituent at the end of the harder branch, of mass
 * `endMass`, with z_g = R_g = 0; tagging fails the jet (all three NaN).
 * β = 0 is the modified mass-drop case (the condition is then z > z_cut at any angle).
 */
export function softDrop(primary: Float64Array, count: number, sd: SoftDropSettings, endMass: number): SoftDropResult {
  const { zCut, beta, R0 } = sd;
  for (let i = 0, at = 0; i < count; i++, at += SPLIT_STRIDE) {
    const z = primary[at + S_Z];
    const delta = primary[at + S_DELTA];
    if (z > zCut * Math.pow(delta / R0, beta)) {
      return { mg: primary[at + S_M], zg: z, Rg: delta };
    }
  }
  if (sd.mode === 'tagging') return { mg: NaN, zg: NaN, Rg: NaN };
  return { mg: endMass, zg: 0, Rg: 0 };
}

/** Primary emission multiplicity: number of primary splittings with kt > ktCut (GeV). */
export function primaryMultiplicity(primary: Float64Array, count: number, ktCut: number): number {
  let c = 0;
  for (let i = 0, at = S_KT; i < count; i++, at += SPLIT_STRIDE) if (primary[at] > ktCut) c++;
  return c;
}
