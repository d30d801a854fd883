// Sequential-recombination jet finding (PHYSICS.md "Jet clustering"): hand-worked examples with the
// generalised-kt distances d_ij = min(pt_i^{2p}, pt_j^{2p}) ΔR²/R², d_iB = pt_i^{2p} (FastJet manual,
// arXiv:1111.6097; anti-kt arXiv:0802.1189; C/A arXiv:hep-ph/9707323), and checks of the fast strategies:
// tiled/grid against the plain N2 port, the NN bookkeeping by brute force, and sub-cubic cost counted in pair
// distances (not timed). Strategy ideas: arXiv:hep-ph/0512210.

import { describe, expect, it } from 'vitest';
import {
  ClusterWorkspace, GRID_MIN_PARTICLES, TILED_MIN_PARTICLES, cluster, findJets, loadParticles,
} from '../../../lib/physics/clustering';
import { TWO_PI, fromPtYPhiM } from '../../../lib/physics/fourvector';
import { generateEvents, generateJets } from '../../support/test-events';
import { Rng } from '../../../lib/physics/random';

/** Massless particles given as [pt, y, φ] → px,py,pz,E interleaved. */
function particles(list: [number, number, number][]): Float64Array {
  const p = new Float64Array(4 * list.length);
  list.forEach(([pt, y, phi], i) => fromPtYPhiM(pt, y, phi, 0, p, 4 * i));
  return p;
}

const sortedSets = (jets: { constituents: number[] }[]) => jets.map((j) => [...j.constituents].sort((a, b) => a - b).join(',')).sort();

describe('hand-worked jet finding', () => {
  it('two particles ΔR = 0.5: separate jets for R = 0.4, one jet for R = 0.6 (every algorithm)', () => {
    // A (pt 100, y 0, φ 0), B (pt 20, y 0.3, φ 0.4): ΔR² = 0.09 + 0.16 = 0.25.
    // R = 0.4: ΔR > R, so d_AB = min(..)·0.25/0.16 > min(d_AB, d_BB) for every p → two jets.
    // R = 0.6: d_AB = min(pt^{2p})·0.25/0.36 < min(d_AB, d_BB) → merged into one jet.
    const p = particles([[100, 0, 0], [20, 0.3, 0.4]]);
    for (const alg of ['antikt', 'kt', 'ca'] as const) {
      expect(findJets(p, alg, 0.4)).toHaveLength(2);
      const one = findJets(p, alg, 0.6);
      expect(one).toHaveLength(1);
      // E-scheme: the jet is the four-vector sum.
      expect(one[0].E).toBeCloseTo(p[3] + p[7], 12);
      expect(one[0].px).toBeCloseTo(p[0] + p[4], 12);
    }
  });

  it('kt and C/A merge the soft pair first, anti-kt lets the hard particle take the nearer soft one', () => {
    // H (pt 100, y 0), S1 (pt 1, y 0.5), S2 (pt 1, y 0.85), all at φ = 0; R = 0.6, R² = 0.36.
    // kt (p = 1):   d(H,S1) = 1·0.25/0.36 = 0.694, d(S1,S2) = 1·0.1225/0.36 = 0.340, d_iB(S) = 1
    //               → S1+S2 first; the pair (pt 2, y = (0.5+0.85)/2 = 0.675 exactly for equal-pt massless
    //               particles) is 0.675 > R from H, d_iB = 4 < d = 4·0.4556/0.36 = 5.06 → jets {H}, {S1,S2}.
    // C/A (p = 0):  d(S1,S2) = 0.340 < d(H,S1) = 0.694 < d_iB = 1 → same jets.
    // anti-kt (p=−1): d(H,S1) = 1e−4·0.694 = 6.9e−5 is the smallest (d_iB(H) = 1e−4) → H+S1, then
    //               ΔR(HS1, S2) ≈ 0.845 > R → jets {H,S1}, {S2}.
    const p = particles([[100, 0, 0], [1, 0.5, 0], [1, 0.85, 0]]);
    expect(sortedSets(findJets(p, 'kt', 0.6))).toEqual(['0', '1,2']);
    expect(sortedSets(findJets(p, 'ca', 0.6))).toEqual(['0', '1,2']);
    expect(sortedSets(findJets(p, 'antikt', 0.6))).toEqual(['0,1', '2']);
    const soft = findJets(p, 'kt', 0.6).find((j) => j.n === 2)!;
    expect(soft.y).toBeCloseTo(0.675, 13);
    expect(soft.pt).toBeCloseTo(2, 13);
  });

  it('distances fold Δφ: particles at φ = 0.1 and 2π − 0.1 are 0.2 apart', () => {
    const p = particles([[50, 0, 0.1], [50, 0, TWO_PI - 0.1]]);
    const jets = findJets(p, 'antikt', 0.4);
    expect(jets).toHaveLength(1);
    // The sum points at φ = 0 (modulo rounding, possibly just below 2π); φ stays in [0, 2π).
    const f = jets[0].phi;
    expect(f).toBeGreaterThanOrEqual(0);
    expect(f).toBeLessThan(TWO_PI);
    expect(Math.min(f, TWO_PI - f)).toBeLessThan(1e-12);
  });

  it('ΔR exactly R does not merge (d_ij uses ΔR² < R² strictly, as FastJet)', () => {
    // y = 0 and y = 0.5 at the same φ: ΔR² = 0.25 = R² for R = 0.5.
    const p = particles([[10, 0, 1], [10, 0.5, 1]]);
    expect(findJets(p, 'ca', 0.5)).toHaveLength(2);
    expect(findJets(p, 'ca', 0.5000001)).toHaveLength(1);
  });

  it('exact ties are resolved deterministically (a square of equal particles)', () => {
    const p = particles([[10, 0, 1], [10, 0.2, 1], [10, 0, 1.2], [10, 0.2, 1.2]]);
    const a = findJets(p, 'kt', 0.5);
    const b = findJets(p, 'kt', 0.5);
    expect(a).toEqual(b);
    expect(a).toHaveLength(1);
  });
});

describe('strategies agree', () => {
  function runBoth(p: Float64Array, pExp: number, R: number) {
    const n = p.length / 4;
    const A = new ClusterWorkspace(), B = new ClusterWorkspace();
    loadParticles(A, p, n);
    cluster(A, { p: pExp, R, strategy: 'plain' });
    loadParticles(B, p, n);
    cluster(B, { p: pExp, R, strategy: 'tiled' });
    return [A, B];
  }

  it('tiled and plain NN give the same clustering sequence on large events (anti-kt, kt, C/A; small and large R)', () => {
    for (const [pExp, R] of [[-1, 0.4], [1, 0.6], [0, 1.0], [-1, 1.5], [1, 0.2], [0, 2.0]] as const) {
      for (const ev of generateEvents(17 + R * 10 + pExp, 2, { nParticles: 1500, nearPhiWrap: R > 1, massiveFraction: 0.2 })) {
        const [A, B] = runBoth(ev, pExp, R);
        expect(B.nNodes).toBe(A.nNodes);
        // Merged four-momenta, in order (node k ≥ n is the k-th recombination).
        for (let k = ev.length / 4; k < A.nNodes; k++) {
          expect(B.E[k]).toBe(A.E[k]);
          expect(B.px[k]).toBe(A.px[k]);
          expect(Math.min(B.parent1[k], B.parent2[k])).toBe(Math.min(A.parent1[k], A.parent2[k]));
        }
        // The same inclusive jets (for C/A the final d_iB are all equal to R², an exact tie whose order is free).
        const ja = Array.from(A.jets.subarray(0, A.nJets)).sort((x, y) => x - y);
        const jb = Array.from(B.jets.subarray(0, B.nJets)).sort((x, y) => x - y);
        expect(jb).toEqual(ja);
      }
    }
  });

  it('the C/A re-clustering loop (R = ∞) has exactly the history of the N2Plain port with R = 1000, ties included', () => {
    // clusterPlainCA skips re-searches with a second-nearest bound; it must not change a single merge, parent
    // order or tie decision. Lattices of equal-pt particles give many exactly equal distances.
    const lattices: Float64Array[] = [];
    for (let g = 0; g < 20; g++) {
      const list: [number, number, number][] = [];
      for (let i = 0; i < 9 + g; i++) list.push([10 + (i % 3), 0.1 * (i % 4), 0.1 * Math.floor(i / 4)]);
      lattices.push(particles(list));
    }
    // Particles and their mirror images in y (pz → −pz negates the rapidity exactly).
    const rng = new Rng(77);
    const mirrored: Float64Array[] = [];
    for (let r = 0; r < 200; r++) {
      const h = rng.int(1, 15);
      const p = new Float64Array(8 * h);
      const f0 = rng.uniform(0, TWO_PI);
      for (let i = 0; i < h; i++) fromPtYPhiM(rng.int(1, 4) * 10, rng.uniform(0.01, 0.5), f0 + 0.3 * rng.normal(), 0, p, 4 * i);
      for (let i = 0; i < h; i++) {
        p.set([p[4 * i], p[4 * i + 1], -p[4 * i + 2], p[4 * i + 3]], 4 * (h + i));
      }
      mirrored.push(p);
    }
    for (const p of [...generateJets(41, 150, { nConstituents: 60 }), ...generateJets(42, 10, { nConstituents: 300 }), ...lattices, ...mirrored]) {
      const n = p.length / 4;
      const A = new ClusterWorkspace(), B = new ClusterWorkspace();
      loadParticles(A, p, n);
      cluster(A, { p: 0, R: 1000, strategy: 'plain' });
      loadParticles(B, p, n);
      cluster(B, { p: 0, R: Infinity, strategy: 'plain' });
      expect(B.nNodes).toBe(A.nNodes);
      expect(B.jets[0]).toBe(A.jets[0]);
      for (let k = n; k < A.nNodes; k++) {
        expect(B.parent1[k]).toBe(A.parent1[k]);
        expect(B.parent2[k]).toBe(A.parent2[k]);
        expect(B.E[k]).toBe(A.E[k]);
      }
    }
  });

  it('the C/A grid (re-clustering into one jet) and plain give the same tree on large jets', () => {
    for (const jet of generateJets(23, 4, { nConstituents: 700, spread: 0.25, massiveFraction: 0.3 })) {
      expect(jet.length / 4).toBeGreaterThan(GRID_MIN_PARTICLES);
      const [A, B] = runBoth(jet, 0, Infinity);
      expect(A.nJets).toBe(1);
      expect(B.nJets).toBe(1);
      expect(B.nNodes).toBe(A.nNodes);
      for (let k = jet.length / 4; k < A.nNodes; k++) {
        expect(B.E[k]).toBe(A.E[k]);
        expect(B.pz[k]).toBe(A.pz[k]);
      }
    }
  });

  it('the C/A grid and plain give the same tree from the grid threshold up to 3 000 constituents', () => {
    for (const N of [GRID_MIN_PARTICLES, 300, 1000, 3000]) {
      for (const jet of generateJets(N, 2, { nConstituents: N, spreadN: 0, massiveFraction: 0.3 })) {
        const [A, B] = runBoth(jet, 0, Infinity);
        expect(B.nJets).toBe(1);
        expect(B.nNodes).toBe(A.nNodes);
        for (let k = N; k < A.nNodes; k++) {
          expect(B.E[k]).toBe(A.E[k]);
          expect(B.pz[k]).toBe(A.pz[k]);
          expect(Math.min(B.parent1[k], B.parent2[k])).toBe(Math.min(A.parent1[k], A.parent2[k]));
        }
      }
    }
  });

  it('the C/A grid takes wide jets (R = 1.2, across φ = 0) and gives the plain loop\'s tree, its bookkeeping checked', () => {
    // Constituents of a wide jet: a core and a flat spray over a disk of radius 1.2 centred at φ = 0.1, so the jet
    // spans about 2.4 rad in φ and crosses φ = 0 (the folding of φ must hold across it).
    const rng = new Rng(2026);
    for (const n of [300, 600]) {
      const p = new Float64Array(4 * n);
      for (let i = 0; i < n; i++) {
        const r = i < n / 3 ? 0.05 * Math.abs(rng.normal()) : 1.2 * Math.sqrt(rng.next());
        const a = rng.uniform(0, TWO_PI);
        fromPtYPhiM(Math.exp(rng.uniform(-1, 4)), 0.3 + r * Math.cos(a), (0.1 + r * Math.sin(a) + TWO_PI) % TWO_PI, 0, p, 4 * i);
      }
      const [A, B] = runBoth(p, 0, Infinity);
      // The grid ran (the plain loop evaluates at least n(n−1)/2 pair distances at its start).
      expect(B.ops).toBeLessThan((n * (n - 1)) / 4);
      expect(B.nNodes).toBe(A.nNodes);
      for (let k = n; k < A.nNodes; k++) {
        expect(B.E[k]).toBe(A.E[k]);
        expect(B.pz[k]).toBe(A.pz[k]);
        expect(Math.min(B.parent1[k], B.parent2[k])).toBe(Math.min(A.parent1[k], A.parent2[k]));
      }
      const ws = new ClusterWorkspace();
      ws.verify = true;
      loadParticles(ws, p, n);
      cluster(ws, { p: 0, R: Infinity, strategy: 'tiled' });
      expect(ws.nJets).toBe(1);
    }
  });

  it('NN bookkeeping checked by brute force after every step, on many irregular configurations', () => {
    // Clumps of random size, isolated particles, wide pt range: exercises NN searches across tiles, the
    // reverse-NN lists, the tile bounds and the far list of the grid (a missed update fails the check).
    const rng = new Rng(99);
    const ws = new ClusterWorkspace();
    ws.verify = true;
    for (let t = 0; t < 1500; t++) {
      const n = rng.int(3, 60);
      const p = new Float64Array(4 * n);
      const nc = rng.int(1, 4);
      const cy: number[] = [], cf: number[] = [], cs: number[] = [];
      for (let c = 0; c < nc; c++) {
        cy.push(rng.uniform(-0.8, 0.8));
        cf.push(rng.uniform(0, 0.7));
        cs.push(Math.exp(rng.uniform(-5, -1)));
      }
      for (let i = 0; i < n; i++) {
        const c = rng.int(0, nc - 1);
        const iso = rng.next() < 0.2;
        const y = iso ? rng.uniform(-1, 1) : cy[c] + cs[c] * rng.normal();
        const f = iso ? rng.uniform(0, 0.75) : cf[c] + cs[c] * rng.normal();
        fromPtYPhiM(Math.exp(rng.uniform(-1, 5)), y, (f + TWO_PI) % TWO_PI, 0, p, 4 * i);
      }
      loadParticles(ws, p, n);
      cluster(ws, { p: 0, R: Infinity, strategy: 'tiled' }); // C/A grid
      loadParticles(ws, p, n);
      ws.tileRings = 1 + (t % 3); // tiles of side R, R/2 and R/3
      cluster(ws, { p: [-1, 0, 1][t % 3], R: rng.uniform(0.05, 1.2), strategy: 'tiled' }); // tiled finder
      ws.tileRings = 0;
    }
    for (const ev of generateEvents(31, 4, { nParticles: 400, nearPhiWrap: true })) {
      for (const rings of [1, 2, 3]) {
        ws.tileRings = rings;
        loadParticles(ws, ev, 400);
        cluster(ws, { p: -1, R: 0.4, strategy: 'tiled' });
      }
    }
    ws.tileRings = 0;
  });
});

describe('cost scaling is sub-cubic (counted pair distances, not timed)', () => {
  // Events grow like real ones (more jets, not ever denser jets): N particles, N/100 sprays, |y| < 4.
  function ops(N: number, pExp: number, R: number, strategy: 'plain' | 'tiled' | 'auto'): number {
    const ws = new ClusterWorkspace();
    let total = 0;
    for (const ev of generateEvents(N, 2, { nParticles: N, nJets: N / 100 })) {
      ws.ops = 0;
      loadParticles(ws, ev, N);
      cluster(ws, { p: pExp, R, strategy });
      total += ws.ops;
    }
    return total;
  }

  it('plain NN bookkeeping is ~N² (doubling N multiplies the work by ~4, a cubic loop would give 8)', () => {
    const r = ops(1600, -1, 0.4, 'plain') / ops(800, -1, 0.4, 'plain');
    expect(r).toBeGreaterThan(3);
    expect(r).toBeLessThan(5);
  });

  it('the tiled strategy (the default above a few dozen particles) grows well below N²', () => {
    // Measured: doubling N multiplies the pair count by 2.3–2.9 (the fixed |y| range gets denser).
    expect(1000).toBeGreaterThan(TILED_MIN_PARTICLES);
    for (const [pExp, R] of [[-1, 0.4], [1, 0.6], [0, 1.0]] as const) {
      const o1 = ops(1000, pExp, R, 'auto'), o2 = ops(2000, pExp, R, 'auto'), o4 = ops(4000, pExp, R, 'auto');
      expect(o2 / o1).toBeLessThan(3.4);
      expect(o4 / o2).toBeLessThan(3.4);
      // And far below the plain strategy's count.
      expect(o4).toBeLessThan(ops(4000, pExp, R, 'plain') / 10);
    }
  });

  it('the C/A grid re-clustering of large jets grows well below N²', () => {
    const count = (N: number) => {
      const ws = new ClusterWorkspace();
      let total = 0;
      for (const jet of generateJets(N, 2, { nConstituents: N, spreadN: 0 })) {
        ws.ops = 0;
        loadParticles(ws, jet, N);
        cluster(ws, { p: 0, R: Infinity });
        total += ws.ops;
      }
      return total;
    };
    const r = count(3200) / count(1600);
    expect(r).toBeLessThan(3);
  });
});
