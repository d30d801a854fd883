// Flavour tags by ghost association on constructed events (PHYSICS.md "Flavour tags"; ghosts as in "The catchment
// area of jets", arXiv:0802.1188): a hadron inside a known jet tags it; one just outside every jet tags nothing;
// two hadrons in one jet give the higher flavour (b over c); jets and splittings are those of the untagged run.
import { describe, expect, it } from 'vitest';
import { fromPtYPhiM } from '@/lib/physics/fourvector';
import { processRecord } from '@/lib/physics/process-record';
import type { ProcessSettings, RecordExtras } from '@/lib/physics/types';

/** Two well separated anti-kt R = 0.4 jets at (y, φ) = (0, 1) and (1, 4), three particles each. */
function event(): Float64Array {
  const p = new Float64Array(24);
  const parts: Array<[number, number, number]> = [
    [100, 0, 1], [40, 0.1, 1.05], [20, -0.05, 0.92],
    [80, 1, 4], [30, 1.12, 3.95], [10, 0.9, 4.1],
  ];
  parts.forEach(([pt, y, phi], i) => fromPtYPhiM(pt, y, phi, 0, p, 4 * i));
  return p;
}

function hadrons(list: Array<[number, number, number, number]>): RecordExtras {
  const tags = new Float64Array(4 * list.length);
  list.forEach(([, pt, y, phi], i) => fromPtYPhiM(pt, y, phi, 5.279, tags, 4 * i));
  return { tags, tagPid: Int32Array.from(list.map(([pid]) => pid)) };
}

const settings: ProcessSettings = {
  content: 'events',
  jet: { algorithm: 'antikt', R: 0.4, ptMin: 5, yMax: 2.5, maxJets: null },
  softDrop: { zCut: 0.1, beta: 0, R0: 0.4 },
  multiplicityKtCut: 1,
  fullTree: true,
  flavourTags: true,
};

describe('ghost association on constructed events', () => {
  const untagged = processRecord(event(), undefined, { ...settings, flavourTags: false });

  it('a B0 inside the second jet tags it b; the first jet is light; jets and splittings do not change', () => {
    const r = processRecord(event(), hadrons([[511, 50, 1.05, 4.02]]), settings);
    expect(r.jets.map((j) => j.flavour)).toEqual([0, 5]);
    expect(r.jets.length).toBe(untagged.jets.length);
    r.jets.forEach((j, i) => {
      const u = untagged.jets[i];
      expect(j.n).toBe(u.n);
      expect(j.pt).toBeCloseTo(u.pt, 12);
      expect(Array.from(j.all!)).toEqual(Array.from(u.all!));
    });
  });

  it('a D+ just outside every jet (ΔR = 0.45 from the first jet axis, R = 0.4) tags nothing, and makes no jet', () => {
    const r = processRecord(event(), hadrons([[411, 30, 0, 1.45]]), settings);
    expect(r.jets.map((j) => j.flavour)).toEqual([0, 0]);
    expect(r.rejected).toEqual(untagged.rejected);
  });

  it('the same D+ just inside (ΔR = 0.3) tags the first jet c', () => {
    const r = processRecord(event(), hadrons([[411, 30, 0, 1.3]]), settings);
    expect(r.jets.map((j) => j.flavour)).toEqual([4, 0]);
  });

  it('two hadrons in one jet: a D0 and a B+ give b; two D mesons give c', () => {
    const both = processRecord(event(), hadrons([[421, 20, 0.05, 1.0], [-521, 40, -0.02, 1.02]]), settings);
    expect(both.jets.map((j) => j.flavour)).toEqual([5, 0]);
    const twoC = processRecord(event(), hadrons([[421, 20, 0.05, 1.0], [-411, 40, -0.02, 1.02]]), settings);
    expect(twoC.jets.map((j) => j.flavour)).toEqual([4, 0]);
  });

  it('a light hadron among the tag particles tags nothing', () => {
    const r = processRecord(event(), hadrons([[211, 20, 0.05, 1.0]]), settings);
    expect(r.jets.map((j) => j.flavour)).toEqual([0, 0]);
  });

  it('e+e- Durham jets are tagged the same way', () => {
    const ee: ProcessSettings = { ...settings, collision: 'ee', ee: { algorithm: 'durham', p: 1, eMin: 0 }, jet: { ...settings.jet, exclusive: { n: 2 } } };
    const r = processRecord(event(), hadrons([[511, 50, 1.05, 4.02]]), ee);
    expect(r.jets.length).toBe(2);
    expect(r.jets.map((j) => j.flavour).sort()).toEqual([0, 5]);
  });
});
