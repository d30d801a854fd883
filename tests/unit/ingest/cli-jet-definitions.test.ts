// The jet-definition settings through the command line (`node dist/engine/cli.js`, the bundle `splitfield
// decluster` runs): every option listed in --help with its default, the options reaching the engine (the same
// jets as the engine called directly with the same settings), counts on stderr, tag particles of
// splitfield-particles records and the decayed heavy-flavour hadrons (status 2) of HepMC3 files.
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fromPtYPhiM } from '@/lib/physics/fourvector';
import { processRecord } from '@/lib/physics/process-record';
import { settingsInputSchema } from '@/lib/ingest/settings';
import { generateEeEvents, generateEvents, listedPids } from '@/tests/support/test-events';
import { engineBundle, HEADER, jsonl, tempDir, toRows } from './helpers';

const t = tempDir('sf-cli-jetdefs-');
const engine = engineBundle('clijd');
const CLI = path.join(engine.dir, 'cli.js');

beforeAll(() => engine.build());
afterAll(() => {
  t.cleanup();
  engine.remove();
});

function run(args: string[]) {
  const r = engine.run(t.dir, [...args, '--threads', '1']);
  return { ...r, lines: r.out.trim() ? r.out.trim().split('\n').map((l) => JSON.parse(l)) : [] };
}

const events = generateEvents(4242, 12, { nParticles: 150, nJets: 3 });
const extras = events.map((p, i) => listedPids(100 + i, p.length / 4));
const file = t.file('events.jsonl', jsonl(HEADER, events.map((p, i) => ({ id: `e${i}`, particles: toRows(p), pid: Array.from(extras[i].pid), charge: Array.from(extras[i].charge) }))));

describe('decluster: jet-definition options', () => {
  it('--help lists every new option with its default', () => {
    const r = spawnSync(process.execPath, [CLI, '--help'], { encoding: 'utf8' });
    for (const o of ['--exclusive-n', '--dcut', '--ycut', '--collision hadron|ee', '--ee-algorithm', '--ee-p', '--emin', '--charged-only', '--constituent-ptmin', '--constituent-ymax', '--constituent-etamax', '--pid-include', '--pid-exclude', '--drop-neutrinos', '--flavour-tags']) {
      const line = r.stdout.split('\n').find((l) => l.trimStart().startsWith(o.split(' ')[0]));
      expect(line, o).toBeDefined();
    }
    expect(r.stdout).toContain('(default hadron');
    expect(r.stdout).toContain('(default durham)');
    expect(r.stdout).toContain('(default -1)');
    expect(r.stdout).toContain('(default: inclusive jets)');
  });

  it('charged-only with a constituent pt threshold: same jets as the engine, removed particles counted on stderr', () => {
    const r = run([file, '--charged-only', '--constituent-ptmin', '0.5', '--drop-neutrinos', '--ptmin', '10']);
    expect(r.code, r.err).toBe(0);
    expect(r.lines[0].constituents).toMatchObject({ chargedOnly: true, ptMin: 0.5, dropNeutrinos: true });
    const settings = { ...settingsInputSchema.parse({ jet: { ptMin: 10 }, particles: { chargedOnly: true, ptMin: 0.5, dropNeutrinos: true } }), content: 'events' as const };
    const ours = events.flatMap((p, i) => processRecord(p, extras[i], settings).jets);
    expect(r.lines.slice(1).map((j) => j.pt)).toEqual(ours.map((j) => j.pt));
    expect(r.err).toMatch(/particles removed: neutrino \d+, pidExcluded 0, pidNotIncluded 0, neutral \d+, pt \d+, rapidity 0/);
  });

  it('exclusive kt jets: exactly 2 a record, said in the header', () => {
    const r = run([file, '--algorithm', 'kt', '--R', '1', '--exclusive-n', '2', '--ptmin', '0', '--ymax', '10']);
    expect(r.code, r.err).toBe(0);
    expect(r.lines[0].jetDefinition).toEqual({ algorithm: 'kt', R: 1, recombination: 'E', exclusive: { n: 2 } });
    expect(r.lines.length - 1).toBe(2 * events.length);
    expect(r.err).toContain('exclusive jets: {"n":2}');
  });

  it('e+e- Durham jets: energies and angles in the lines and header', () => {
    const ee = generateEeEvents(77, 6, { nParticles: 60 });
    const eeFile = t.file('ee.jsonl', jsonl(HEADER, ee.map((p, i) => ({ id: i, particles: toRows(p) }))));
    const r = run([eeFile, '--collision', 'ee', '--ycut', '0.02', '--emin', '2']);
    expect(r.code, r.err).toBe(0);
    expect(r.lines[0]).toMatchObject({ jetDefinition: { collision: 'ee', algorithm: 'durham', exclusive: { ycut: 0.02 } }, cuts: { eMin: 2 }, reclustering: 'ee-cambridge' });
    expect(r.lines[0].columns.primary[0]).toBe('lnInvTheta');
    for (const j of r.lines.slice(1)) {
      expect(j.E).toBeGreaterThan(2);
      expect(j.theta).toBeGreaterThanOrEqual(0);
      expect(j.pt).toBeUndefined();
    }
    expect(r.err).toMatch(/jets rejected: energy \d+, rank 0/);
  });

  it('refuses contradictory settings with the rule', () => {
    const r = run([file, '--exclusive-n', '2']);
    expect(r.code).toBe(2);
    expect(r.err).toContain('exclusive jets need jet.algorithm "kt" or "ca"');
    expect(run([file, '--pid-include', '211,pion']).err).toContain('--pid-include 211,pion: must be particle codes');
  });

  it('a record without pid or charge, when charged-only needs one, fails with its line', () => {
    const bare = t.file('bare.jsonl', jsonl(HEADER, [{ id: 'x', particles: toRows(events[0]) }]));
    const r = run([bare, '--charged-only']);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/line 2: these settings need what this record lacks: the constituent selection \(charged-only\) needs per-particle "charge" or "pid", and this record has neither/);
  });
});

describe('flavour tags from files', () => {
  // One anti-kt jet at (y, φ) = (0, 1) and one at (1, 4); a B+ inside the second.
  const p = new Float64Array(16);
  fromPtYPhiM(100, 0, 1, 0, p, 0);
  fromPtYPhiM(30, 0.1, 1.05, 0, p, 4);
  fromPtYPhiM(80, 1, 4, 0, p, 8);
  fromPtYPhiM(20, 1.1, 4.05, 0, p, 12);
  const b = new Float64Array(4);
  fromPtYPhiM(60, 1.02, 4.01, 5.279, b, 0);

  it('splitfield-particles "tagParticles"/"tagPid": jet lines carry the flavour, stderr the counts', () => {
    const f = t.file('tagged.jsonl', jsonl(HEADER, [{ id: 't', particles: toRows(p), tagParticles: toRows(b), tagPid: [521] }, { id: 'u', particles: toRows(p) }]));
    const r = run([f, '--flavour-tags']);
    expect(r.code, r.err).toBe(0);
    expect(r.lines[0].flavourTags).toMatchObject({ method: 'ghost association' });
    expect(r.lines.slice(1).map((j) => [j.rec, j.flavour])).toEqual([['t', 'light'], ['t', 'b'], ['u', 'light'], ['u', 'light']]);
    expect(r.err).toContain('jet flavours: b 1, c 0, light 3');
    // Without the setting the file reads as before and lines have no flavour.
    expect(run([f]).lines[1].flavour).toBeUndefined();
  });

  it('a bad tag particle is refused with its place', () => {
    const f = t.file('badtag.jsonl', jsonl(HEADER, [{ id: 't', particles: toRows(p), tagParticles: [[1, 2, 3]], tagPid: [521] }]));
    expect(run([f, '--flavour-tags']).err).toMatch(/line 2, tag particle 0: a tag particle must be an array of 4 finite numbers/);
  });

  it('HepMC3: a decayed B0 (status 2) tags the jet it points into', () => {
    const e16 = (x: number) => x.toExponential(16);
    const lines = ['HepMC::Version 3.01.02', 'HepMC::Asciiv3-START_EVENT_LISTING', 'E 1 1 6', 'U GEV MM'];
    lines.push(`P 1 0 511 ${[...b].map(e16).join(' ')} ${e16(5.279)} 2`);
    lines.push('V -1 0 [1]');
    for (let i = 0; i < 4; i++) lines.push(`P ${i + 2} -1 211 ${e16(p[4 * i])} ${e16(p[4 * i + 1])} ${e16(p[4 * i + 2])} ${e16(p[4 * i + 3])} 0 1`);
    lines.push('P 6 -1 22 1 0 0 1 0 1', 'HepMC::Asciiv3-END_EVENT_LISTING');
    const f = t.file('tagged.hepmc3', lines.join('\n') + '\n');
    const r = run([f, '--flavour-tags']);
    expect(r.code, r.err).toBe(0);
    expect(r.lines.slice(1).map((j) => j.flavour)).toEqual(['light', 'b']);
  });
});
