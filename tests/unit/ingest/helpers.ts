// Test helpers of the ingest tests: temporary files and small inputs.
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import { openParticleFile } from '@/lib/ingest/reader';
import type { ParticleRecord, ReaderOptions } from '@/lib/ingest/types';
import { IngestError } from '@/lib/ingest/errors';

export function tempDir(prefix = 'sf-ingest-'): { dir: string; file: (name: string, content: string | Buffer) => string; cleanup: () => void } {
  const dir = mkdtempSync(path.join(tmpdir(), prefix));
  return {
    dir,
    file: (name, content) => {
      const p = path.join(dir, name);
      writeFileSync(p, content);
      return p;
    },
    cleanup: () => rmSync(dir, { recursive: true, force: true }),
  };
}

export const HEADER = {
  format: 'splitfield-particles',
  version: 1,
  content: 'events',
  momentum: 'px,py,pz,E',
  energyUnit: 'GeV',
  sample: { name: 'test', label: 'Test sample', tags: ['unit'] },
};

export function jsonl(header: object, records: unknown[]): string {
  return [JSON.stringify(header), ...records.map((r) => (typeof r === 'string' ? r : JSON.stringify(r)))].join('\n') + '\n';
}

export const gz = (s: string): Buffer => gzipSync(Buffer.from(s));

export async function readAll(file: string, opts: ReaderOptions = {}): Promise<{ records: ParticleRecord[]; skipped: number; header: unknown }> {
  const r = await openParticleFile(file, opts);
  const records: ParticleRecord[] = [];
  for await (const rec of r.records()) records.push(rec);
  return { records, skipped: r.skipped, header: r.header };
}

/** The IngestError that reading the whole file throws (fails the test if none). */
export async function readError(file: string, opts: ReaderOptions = {}): Promise<IngestError> {
  try {
    await readAll(file, opts);
  } catch (e) {
    if (e instanceof IngestError) return e;
    throw new Error(`expected an IngestError, got ${(e as Error)?.stack ?? e}`);
  }
  throw new Error('expected an IngestError, but the file was read without error');
}

/** A massless particle of given pt, y, phi (px, py, pz, E). */
export function massless(ptv: number, y: number, phi: number): number[] {
  return [ptv * Math.cos(phi), ptv * Math.sin(phi), ptv * Math.sinh(y), ptv * Math.cosh(y)];
}

/** A deterministic small event: a few collimated sprays plus soft noise. */
export function toyEvent(seed: number, n = 40): number[][] {
  let s = seed * 2654435761 % 4294967296 || 1;
  const rnd = () => ((s = (1664525 * s + 1013904223) % 4294967296) / 4294967296);
  const out: number[][] = [];
  const axes = [
    [0.3 + rnd(), 2 * Math.PI * rnd()],
    [-0.5 - rnd(), 2 * Math.PI * rnd()],
  ];
  for (let i = 0; i < n; i++) {
    const a = axes[i % 2];
    const ptv = i < 2 * Math.floor(n / 3) ? 5 + 60 * rnd() * rnd() : 0.5 + 2 * rnd();
    const spread = i < 2 * Math.floor(n / 3) ? 0.25 : 2.5;
    out.push(massless(ptv, a[0] + spread * (rnd() - 0.5), a[1] + spread * (rnd() - 0.5)));
  }
  return out;
}

/** Particles (px,py,pz,E interleaved) as the JSON array of 4-arrays of the file format. */
export function toRows(p: Float64Array): number[][] {
  const rows: number[][] = [];
  for (let i = 0; i < p.length; i += 4) rows.push([p[i], p[i + 1], p[i + 2], p[i + 3]]);
  return rows;
}

/** A HepMC3 ASCII text (as written by HepMC3's WriterAscii) of events given as px,py,pz,E arrays (GeV). */
export function hepmc3Text(events: Float64Array[], opts: { weights?: number[]; unit?: 'GEV' | 'MEV' } = {}): string {
  const f = opts.unit === 'MEV' ? 1000 : 1;
  const e16 = (x: number) => x.toExponential(16);
  const out = ['HepMC::Version 3.01.02', 'HepMC::Asciiv3-START_EVENT_LISTING', 'W Default', 'T toy\\|1.0\\|unit test'];
  events.forEach((p, ev) => {
    const n = p.length / 4;
    out.push(`E ${ev} 1 ${n + 3}`, `U ${opts.unit ?? 'GEV'} MM`, `W ${e16(opts.weights?.[ev] ?? 1)}`);
    out.push(`P 1 0 2212 ${e16(0)} ${e16(0)} ${e16(6500 * f)} ${e16(6500.0000677 * f)} ${e16(0.938 * f)} 4`);
    out.push(`P 2 0 2212 ${e16(0)} ${e16(0)} ${e16(-6500 * f)} ${e16(6500.0000677 * f)} ${e16(0.938 * f)} 4`);
    out.push('V -1 0 [1,2]');
    out.push(`P 3 -1 23 ${e16(0)} ${e16(0)} ${e16(1)} ${e16(100 * f)} ${e16(99.99 * f)} 2`);
    for (let i = 0; i < n; i++) {
      const [px, py, pz, E] = [p[4 * i], p[4 * i + 1], p[4 * i + 2], p[4 * i + 3]].map((x) => x * f);
      out.push(`P ${i + 4} -1 211 ${e16(px)} ${e16(py)} ${e16(pz)} ${e16(E)} ${e16(0)} 1`);
    }
  });
  out.push('HepMC::Asciiv3-END_EVENT_LISTING');
  return out.join('\n') + '\n';
}

/**
 * The engine bundle of one test file, built into its own directory inside the project (so that the bundle finds
 * the installed piscina; parallel test files never share a bundle that is being rebuilt), and a runner of its
 * command line (`node cli.js ...`, the bundle `splitfield decluster` runs) in `cwd`.
 */
export function engineBundle(tag: string) {
  const root = path.resolve(__dirname, '../../..');
  const dir = path.join(root, 'tests/artifacts', `engine-${tag}-${process.pid}`);
  const cli = path.join(dir, 'cli.js');
  return {
    dir,
    build: () => execFileSync('node', ['scripts/build-engine.mjs', '--outdir', dir], { cwd: root, stdio: 'pipe' }),
    remove: () => rmSync(dir, { recursive: true, force: true }),
    run: (cwd: string, args: string[], input?: Buffer | string) => {
      const r = spawnSync(process.execPath, [cli, ...args], { cwd, input, encoding: 'utf8', maxBuffer: 1 << 28 });
      return { code: r.status, out: r.stdout, err: r.stderr };
    },
  };
}
