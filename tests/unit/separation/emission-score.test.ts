// The per-bin ln-ratio table and the per-jet score of the Poisson emission model (PHYSICS.md "Telling samples
// apart": score = Σ_primary ln(ρ_S/ρ_B)(emission) − ∫(ρ_S − ρ_B)).
// Physics check: the generator's emissions (as drawn, lib/physics/emission-generator.ts) for a quark (C_F = 4/3) and
// a gluon (C_A = 3) leading parton have the soft-collinear density 2 α_s(kt) C_i/π (PHYSICS.md "Leading-order
// expectation": Altarelli–Parisi, Nucl. Phys. B126 (1977) 298, colour factors of SU(3)), so in the soft-collinear
// region (here z < 0.02) the per-bin ln-ratio gluon/quark is ln(C_A/C_F) = ln(9/4): the running coupling cancels.
// Drawn emissions are compared, not declustered ones, because C/A clustering changes the two densities by
// different amounts (PHYSICS.md "Clustering effects").
import { describe, expect, it } from 'vitest';
import { generateEmissionJet, type EmissionSettings } from '@/lib/physics/emission-generator';
import { axisBins } from '@/lib/physics/plane/bins';
import { densityOf, fillPlane } from '@/lib/physics/plane/binned-plane';
import { Rng } from '@/lib/physics/random';
import { C_A, C_F } from '@/lib/physics/running-coupling';
import { packed, scoreJets, scoreTable } from '@/lib/physics/separation/emission-score';
import { logRatioTable } from '@/lib/physics/separation/log-ratio';
import { splitJets } from '@/lib/physics/separation/split';

describe('scoring a jet with a table', () => {
  const bins = { x: axisBins(0, 2, 1), y: axisBins(0, 1, 1) };
  const table = scoreTable(bins, Float64Array.from([Math.log(2), Math.log(0.5)]), Uint8Array.from([0, 0]), 0.3);

  it('adds ln(ρ_S/ρ_B) of each emission’s bin to −∫(ρ_S − ρ_B)', () => {
    // jet 0: two emissions in bin 0, one in bin 1; jet 1: none; jet 2: one outside, one on the upper x edge (bin 1)
    const xs = [0.5, 0.2, 1.5, 5, 2];
    const ys = [0.5, 0.9, 0.1, 0.5, 0.5];
    const jetRow = [0, 0, 0, 2, 2];
    const scores = scoreJets(table, { xs, ys, jetRow, member: null, jets: Uint8Array.from([1, 1, 1]) });
    expect(scores[0]).toBeCloseTo(2 * Math.log(2) + Math.log(0.5) - 0.3, 12);
    expect(scores[1]).toBeCloseTo(-0.3, 12);
    expect(scores[2]).toBeCloseTo(Math.log(0.5) - 0.3, 12);
  });

  it('skips masked bins, splittings outside the tree and jets not asked for, packing the rest in order', () => {
    const masked = scoreTable(bins, Float64Array.from([Math.log(2), Number.NaN]), Uint8Array.from([0, 1]), 0.1);
    const xs = [0.5, 1.5, 0.5, 0.5];
    const ys = [0.5, 0.5, 0.5, 0.5];
    const jetRow = [0, 0, 1, 2];
    const scores = scoreJets(masked, { xs, ys, jetRow, member: Uint8Array.from([1, 1, 1, 0]), jets: Uint8Array.from([1, 0, 1]) });
    expect(Array.from(scores)).toEqual([Math.log(2) - 0.1, -0.1]);
    expect(Array.from(packed([10, 20, 30], Uint8Array.from([1, 0, 1])))).toEqual([10, 30]);
  });
});

describe('ln(ρ_g/ρ_q) of the generator’s emissions', () => {
  const R = 0.8;
  const settings = (parton: 'quark' | 'gluon'): EmissionSettings => ({ parton, pt: 1000, R, yMax: 1, ktCut: 1, hardCollinear: true, background: null });
  /** Drawn emissions of `jets` jets as ln(R/Δ), ln kt columns, each jet its own record. */
  function drawn(parton: 'quark' | 'gluon', jets: number, seed: number) {
    const xs: number[] = [];
    const ys: number[] = [];
    const jetRow: number[] = [];
    const rng = new Rng(seed);
    for (let j = 0; j < jets; j++) {
      generateEmissionJet(rng, settings(parton), undefined, (delta, _z, kt) => {
        xs.push(Math.log(R / delta));
        ys.push(Math.log(kt));
        jetRow.push(j);
      });
    }
    const record = Int32Array.from({ length: jets }, (_, j) => j);
    return { xs, ys, jetRow, weight: new Float64Array(jets).fill(1), split: splitJets(record, new Uint8Array(jets).fill(1)) };
  }

  it('is ln(9/4) in every soft-collinear bin (z < 0.02), within errors, on the training halves', () => {
    const gluon = drawn('gluon', 24_000, 101);
    const quark = drawn('quark', 24_000, 202);
    // ln(R/Δ) ∈ [0, 2], ln kt ∈ [0, 0.6]: z = kt/(pt Δ) ≤ e^0.6/(1000 · 0.8 e^−2) ≈ 0.017.
    const bins = { x: axisBins(0, 2, 0.5), y: axisBins(0, 0.6, 0.2) };
    const plane = (s: ReturnType<typeof drawn>) => densityOf(fillPlane(bins, { xs: s.xs, ys: s.ys, jetRow: s.jetRow, member: null, jetWeight: s.weight, selected: s.split.train }));
    const table = logRatioTable(plane(gluon), plane(quark), 10);
    const expected = Math.log(C_A / C_F);
    expect(expected).toBeCloseTo(Math.log(9 / 4), 12);
    let sumW = 0;
    let sumWV = 0;
    for (let i = 0; i < table.value.length; i++) {
      expect(table.masked[i]).toBe(0);
      expect(Math.abs(table.value[i] - expected)).toBeLessThan(4 * table.error[i]);
      sumW += 1 / table.error[i] ** 2;
      sumWV += table.value[i] / table.error[i] ** 2;
    }
    const mean = sumWV / sumW;
    expect(Math.abs(mean - expected)).toBeLessThan(3 / Math.sqrt(sumW));
    expect(1 / Math.sqrt(sumW)).toBeLessThan(0.02);

    // The evaluation halves score higher for gluon jets: the table is a gluon tagger.
    const t = scoreTable(bins, table.value, table.masked, table.excessPerJet);
    const mean0 = (s: ReturnType<typeof drawn>) => {
      const scores = scoreJets(t, { xs: s.xs, ys: s.ys, jetRow: s.jetRow, member: null, jets: s.split.evaluate });
      return scores.reduce((a, b) => a + b, 0) / scores.length;
    };
    expect(mean0(gluon)).toBeGreaterThan(mean0(quark));
  });
});
