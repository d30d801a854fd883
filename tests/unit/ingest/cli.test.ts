// The command line end to end: `node dist/engine/cli.js` (the bundle `npm run decluster` runs) on small files.
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateEvents } from '@/tests/support/test-events';
import { HEADER, engineBundle, gz, hepmc3Text, jsonl, tempDir, toRows } from './helpers';

const t = tempDir('sf-cli-');
// `npm run decluster` runs dist/engine/cli.js; this test builds the same bundle into its own directory.
const engine = engineBundle('cli');

beforeAll(() => engine.build());
afterAll(() => {
  t.cleanup();
  engine.remove();
});

const run = (args: string[], input?: Buffer | string) => engine.run(t.dir, args, input);

const events = generateEvents(99, 20, { nParticles: 120, nJets: 3 });
const records = events.map((p, i) => ({ id: `ev${i}`, particles: toRows(p) }));
const file = t.file('events.jsonl', jsonl(HEADER, records));

describe('decluster command line', () => {
  it('writes the export to stdout and a report to stderr', () => {
    const r = run([file, '--threads', '1']);
    expect(r.code).toBe(0);
    const lines = r.out.trim().split('\n').map((l) => JSON.parse(l));
    expect(lines[0]).toMatchObject({ format: 'splitfield-declusterings', version: 1, jetDefinition: { algorithm: 'antikt', R: 0.4 }, cuts: { ptMin: 20, yMax: 2.5 } });
    const jets = lines.slice(1);
    expect(jets.length).toBeGreaterThan(20);
    expect(jets.every((j) => j.pt > 20 && Math.abs(j.y) < 2.5 && /^ev\d+$/.test(j.rec))).toBe(true);
    expect(r.err).toMatch(/records 20 \(2,400 particles\), jets \d+, primary splittings \d+/);
    expect(r.err).toMatch(/jets\/s, .* records\/s, .* particles\/s, .* MB\/s read; threads 1; peak RSS \d+ MB/);
    expect(r.err).toContain(`jets ${jets.length},`);
  });

  it('--out with --threads 2 and gzip input writes the same bytes as threads 1 on stdout; options reach the engine', () => {
    const gzFile = t.file('events.jsonl.gz', gz(jsonl(HEADER, records)));
    const opts = ['--R', '0.6', '--ptmin', '30', '--njets', '2', '--all', '--algorithm', 'kt', '--zcut', '0.2', '--beta', '1', '--ktcut', '2'];
    const a = run([file, '--threads', '1', ...opts]);
    const b = run([gzFile, '--threads', '2', '--out', 'out.jsonl', ...opts]);
    expect([a.code, b.code]).toEqual([0, 0]);
    expect(b.out).toBe('');
    const written = readFileSync(path.join(t.dir, 'out.jsonl'), 'utf8');
    const body = (s: string) => s.split('\n').slice(1).join('\n');
    expect(body(written)).toBe(body(a.out));
    const head = JSON.parse(written.split('\n')[0]);
    expect(head).toMatchObject({
      jetDefinition: { algorithm: 'kt', R: 0.6 },
      cuts: { ptMin: 30, maxJets: 2 },
      softDrop: { zCut: 0.2, beta: 1, R0: 0.6 },
      multiplicityKtCut: 2,
      fullTree: true,
    });
    const jets = written.trim().split('\n').slice(1).map((l) => JSON.parse(l));
    expect(jets.every((j) => j.jet < 2 && j.pt > 30 && Array.isArray(j.all))).toBe(true);
    expect(b.err).toMatch(/gzip\) -> out\.jsonl/);
  });

  it('reads HepMC3 input and stdin', () => {
    const hep = t.file('events.hepmc', hepmc3Text(events));
    const a = run([hep, '-q']);
    const b = run(['-', '-q'], gz(jsonl(HEADER, events.map((p, i) => ({ id: i, particles: toRows(p) })))));
    expect([a.code, b.code, a.err, b.err]).toEqual([0, 0, '', '']);
    expect(a.out.split('\n').slice(1)).toEqual(b.out.split('\n').slice(1));
  });

  it('bad input: exit 1 with the line and particle, and no output file left behind', () => {
    const bad = records.map((r) => JSON.stringify(r));
    bad[6] = JSON.stringify({ id: 'x', particles: [[1, 2, 3, 10], [0, 0, 2, 1]] });
    const badFile = t.file('bad.jsonl', jsonl(HEADER, bad));
    for (const threads of ['1', '2']) {
      const r = run([badFile, '--threads', threads, '--out', 'bad-out.jsonl']);
      expect(r.code).toBe(1);
      expect(r.err).toBe(`decluster: error: ${badFile}: line 8, particle 1: energy below momentum: E = 1 < |p| = 2\n`);
      expect(existsSync(path.join(t.dir, 'bad-out.jsonl'))).toBe(false);
      expect(readdirSync(t.dir).filter((f) => f.includes('partial'))).toEqual([]);
    }
    const s = run([badFile, '--skip-bad', '--threads', '2']);
    expect(s.code).toBe(0);
    expect(s.err).toContain('decluster: skipped line 8, particle 1: energy below momentum');
    expect(s.err).toMatch(/records 19 .*\n[\s\S]*skipped 1 bad record\n/);
    const empty = run([t.file('empty.jsonl', '')]);
    expect([empty.code, empty.err]).toEqual([1, expect.stringMatching(/^decluster: error: .*empty\.jsonl: line 1: the file is empty/)]);
    const missing = run(['nope.jsonl']);
    expect([missing.code, missing.err]).toEqual([1, 'decluster: error: nope.jsonl: cannot read nope.jsonl: no such file\n']);
  });

  it('usage errors exit 2; --help and --version exit 0', () => {
    for (const args of [[], ['a', 'b'], [file, '--R', '-1'], [file, '--threads', '0'], [file, '--algorithm', 'siscone'], [file, '--bogus']]) {
      const r = run(args);
      expect(r.code).toBe(2);
      expect(r.err).toMatch(/^decluster: .*\nUsage: splitfield decluster INPUT/);
    }
    expect(run([file, '--R', '-1']).err).toMatch(/^decluster: --R -1: must be a number in \(0, 10\]/);
    const h = run(['--help']);
    expect([h.code, h.out]).toEqual([0, expect.stringContaining('--skip-bad')]);
    expect(h.out).toContain('Exit codes: 0 done, 1 bad input or processing error, 2 usage error, 130 interrupted.');
    expect(run(['--version']).out).toMatch(/^splitfield \d+\.\d+\.\d+\n$/);
  });

  it('--progress on a pipe prints plain progress lines (the bar is for terminals)', () => {
    const r = run([file, '--progress', '-q', '--threads', '1']);
    expect(r.code).toBe(0);
    expect(r.err).toMatch(/^100% \[#+\] [\d.]+\/[\d.]+ MB {2}records 20 {2}jets \d+ {2}[\d,]+ jets\/s\n$/);
  });
});
