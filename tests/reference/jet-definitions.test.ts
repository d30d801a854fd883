// Constituent selection, exclusive jets and e+e- jets checked against FastJet, every jet and every splitting.
// Reference: FastJet 3.4.0 (Debian libfastjet-dev, libfastjetplugins-dev) through tests/reference/fastjet-ref.cc:
// ClusterSequence::exclusive_jets_up_to / exclusive_jets(dcut) / exclusive_jets_ycut, ee_kt_algorithm (Durham,
// Phys. Lett. B269 (1991) 432), ee_genkt_algorithm (FastJet manual arXiv:1111.6097), EECambridgePlugin (e+e-
// Cambridge, arXiv:hep-ph/9707323), has_parents for the declustering; e+e- splitting variables of PHYSICS.md
// "Lepton-collider (e+e-) events". Particle charges of the selection: the Review of Particle Physics (listed in
// tests/support/test-events.ts LISTED_CHARGES, given to the reference as "charge").

import { beforeAll, describe, expect, it } from 'vitest';
import { processRecord } from '../../lib/physics/process-record';
import type { RecordExtras } from '../../lib/physics/types';
import { generateEeEvents, generateEvents, generateJets, listedPids } from '../support/test-events';
import { crossCheck } from './compare';
import { ensureFastjetRef } from './fastjet';

beforeAll(() => {
  ensureFastjetRef();
});

function agree(c: ReturnType<typeof crossCheck>, minJets: number, minSplittings = 0): void {
  expect(c.mismatches, c.mismatches.join('\n')).toEqual([]);
  expect(c.jets).toBeGreaterThanOrEqual(minJets);
  expect(c.splittings).toBeGreaterThanOrEqual(minSplittings);
}

function withPids(events: Float64Array[], seed: number): RecordExtras[] {
  return events.map((p, i) => listedPids(seed + i, p.length / 4));
}

describe('constituent selection vs FastJet on the selected particles (Reference: FastJet 3.4.0 (Debian libfastjet-dev))', () => {
  const events = generateEvents(8101, 10, { nParticles: 300 });
  const extras = withPids(events, 500);

  it('charged only (from "charge") with a constituent pt threshold, anti-kt R = 0.4', () => {
    const c = crossCheck('events', events, { R: 0.4, ptMin: 10, all: true, particles: { chargedOnly: true, ptMin: 0.5 } }, {}, extras);
    agree(c, 15, 200);
    const removed = c.ours.reduce((a, r) => a + r.removed!.neutral + r.removed!.pt, 0);
    expect(removed).toBeGreaterThan(500);
  });

  it('charged only from pid through the numbering scheme (the reference reads the listed charges)', () => {
    const c = crossCheck('events', events, { R: 0.4, ptMin: 10, all: true, particles: { chargedOnly: true } }, {}, extras);
    agree(c, 15);
    // The same records with pids alone: the charges come from the numbering scheme, and the results are the same.
    const fromPid = events.map((p, i) => processRecord(p, { pid: extras[i].pid }, c.settings));
    expect(fromPid).toEqual(c.ours);
  });

  it('neutrinos, pid exclude and include lists, |y| and |η| limits, each counted by the first rule failed', () => {
    for (const rapidityKind of ['y', 'eta'] as const) {
      const c = crossCheck('events', events, {
        algorithm: 'kt', R: 0.6, ptMin: 5,
        particles: { dropNeutrinos: true, pidExclude: [2112], pidInclude: [211, 321, 2212, 22, 11, 13, 2112, 3122], rapidityMax: 2, rapidityKind, ptMin: 0.3 },
      }, {}, extras);
      agree(c, 10);
      const sum = (k: string) => c.ours.reduce((a, r) => a + (r.removed as unknown as Record<string, number>)[k], 0);
      for (const rule of ['neutrino', 'pidExcluded', 'pidNotIncluded', 'pt', 'rapidity']) expect(sum(rule), rule).toBeGreaterThan(0);
    }
  });

  it('pre-clustered jets: the selection applies before the C/A re-clustering', () => {
    const jets = generateJets(8102, 20, { nConstituents: 60 });
    const c = crossCheck('jets', jets, { ptMin: 0, yMax: 10, all: true, particles: { chargedOnly: true, ptMin: 1 } }, {}, withPids(jets, 900));
    agree(c, 20, 300);
  });
});

describe('exclusive jets vs FastJet (Reference: FastJet 3.4.0 (Debian libfastjet-dev) exclusive_jets)', () => {
  const events = generateEvents(8201, 10, { nParticles: 200, nJets: 4 });
  for (const algorithm of ['kt', 'ca'] as const) {
    for (const n of [2, 4]) {
      it(`${algorithm}, exactly ${n} jets, R = 1`, () => {
        const c = crossCheck('events', events, { algorithm, R: 1, ptMin: 0, yMax: 100, all: true, exclusive: { n } }, {}, []);
        agree(c, 10 * n, 500);
        for (const r of c.ours) expect(r.jets.length).toBe(n);
      });
    }
  }
  it('kt until d_cut = 400 GeV², R = 1', () => {
    const c = crossCheck('events', events, { algorithm: 'kt', R: 1, ptMin: 0, yMax: 100, exclusive: { dcut: 400 } });
    agree(c, 20);
    expect(new Set(c.ours.map((r) => r.jets.length)).size).toBeGreaterThan(1);
  });
  it('C/A until d_cut = 0.04, R = 0.8, with the usual cuts and a leading-N limit', () => {
    const c = crossCheck('events', events, { algorithm: 'ca', R: 0.8, ptMin: 5, maxJets: 3, exclusive: { dcut: 0.04 }, all: true });
    agree(c, 20);
  });
  it('more jets asked for than particles: every particle is a jet', () => {
    const c = crossCheck('events', [new Float64Array([10, 0, 1, 11, 0, 8, -2, 9, -5, -5, 0, 8])], { algorithm: 'kt', R: 1, ptMin: 0, yMax: 10, exclusive: { n: 5 } });
    agree(c, 3);
  });
});

describe('e+e- jets vs FastJet (Reference: FastJet 3.4.0 ee_kt_algorithm, ee_genkt_algorithm, EECambridgePlugin)', () => {
  const events = generateEeEvents(8301, 12, { nParticles: 120, nJets: 3, massiveFraction: 0.3 });
  const ee = (algorithm: 'durham' | 'cambridge' | 'genkt', p = -1, eMin = 0) => ({ algorithm, p, eMin });

  for (const n of [2, 3, 4]) {
    it(`Durham, exactly ${n} jets, full trees`, () => {
      const c = crossCheck('events', events, { ee: ee('durham'), exclusive: { n }, all: true });
      agree(c, 12 * n, 1000);
    });
  }
  it('Durham with y_cut = 0.01, an energy cut and a leading-N limit', () => {
    const c = crossCheck('events', events, { ee: ee('durham', -1, 3), exclusive: { ycut: 0.01 }, maxJets: 3, all: true });
    agree(c, 24);
  });
  for (const ycut of [0.005, 0.05]) {
    it(`e+e- Cambridge with y_cut = ${ycut}`, () => {
      const c = crossCheck('events', events, { ee: ee('cambridge'), exclusive: { ycut }, all: true });
      agree(c, 24, 500);
    });
  }
  for (const [p, R] of [[-1, 0.4], [0, 0.7], [1, 1.0], [-1, 3.5]] as const) {
    it(`generalised e+e- kt, p = ${p}, R = ${R}`, () => {
      const c = crossCheck('events', events, { ee: ee('genkt', p, 1), R, all: true });
      // Above R = π every pair may merge: one jet an event.
      agree(c, R > Math.PI ? 12 : 24, 300);
    });
  }
  it('pre-clustered jets re-clustered with e+e- Cambridge', () => {
    const jets = generateJets(8302, 15, { nConstituents: 40 });
    const c = crossCheck('jets', jets, { ee: ee('durham'), all: true });
    agree(c, 15, 500);
  });
  it('charged-only e+e- events', () => {
    const c = crossCheck('events', events, { ee: ee('durham'), exclusive: { n: 2 }, particles: { chargedOnly: true } }, {}, withPids(events, 77));
    agree(c, 24);
  });
});
