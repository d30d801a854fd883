// Test helper around tests/reference/fastjet-ref.cc (Reference: FastJet 3.4.0 (Debian libfastjet-dev)):
// compiles it (and the benchmark's fastjet-speed.cc) when the binary is missing or older than its sources,
// writes a splitfield-particles input file, runs it, and parses its splitfield-declusterings output (with its
// --debug extras).

import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, renameSync, rmSync, statSync, writeFileSync, readFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Algorithm, ConstituentSelection, EeJetDefinition, ExclusiveJets, ProcessSettings } from '../../lib/physics/types';
import { NO_SELECTION } from '../../lib/physics/constituent-selection';
import type { EnergyUnit, MomentumConvention } from '../../lib/physics/fourvector';

const here = path.dirname(fileURLToPath(import.meta.url));
/**
 * The two FastJet programs: fastjet-ref (the tests' reference: a JSON DOM reader, --debug extras) and
 * fastjet-speed (the benchmark's speed reference: streaming hand-written reader). Both include declustering.hh.
 */
export type ReferenceProgram = 'fastjet-ref' | 'fastjet-speed';

const SHARED_SOURCE = path.join(here, 'declustering.hh');

/** Builds a reference program (g++ -O2) if its binary is missing or older than its sources; returns its path. */
export function ensureReferenceProgram(name: ReferenceProgram): string {
  const source = path.join(here, `${name}.cc`);
  const bin = path.join(here, 'bin', name);
  const built = existsSync(bin) ? statSync(bin).mtimeMs : -Infinity;
  if ([source, SHARED_SOURCE].every((f) => statSync(f).mtimeMs <= built)) return bin;
  const headers = [
    '/usr/include/fastjet/ClusterSequence.hh',
    ...(name === 'fastjet-ref' ? ['/usr/include/nlohmann/json.hpp', '/usr/include/fastjet/EECambridgePlugin.hh'] : []),
  ];
  if (!headers.every((h) => existsSync(h))) {
    throw new Error(
      'The FastJet reference needs Debian packages libfastjet-dev libfastjettools-dev libfastjetplugins-dev nlohmann-json3-dev ' +
        '(scripts/ensure-debian-packages.sh installs them).',
    );
  }
  mkdirSync(path.dirname(bin), { recursive: true });
  // Safe with parallel test files: each builds into its own file, renamed into place.
  const tmp = `${bin}.${process.pid}.tmp`;
  const plugins = name === 'fastjet-ref' ? ['-lfastjetplugins'] : []; // the e+e- Cambridge plugin
  execFileSync('g++', ['-O2', '-std=c++17', '-o', tmp, source, '-lfastjettools', ...plugins, '-lfastjet'], { stdio: 'pipe' });
  renameSync(tmp, bin);
  return bin;
}

/** Builds the tests' reference program if needed; returns the binary's path. */
export function ensureFastjetRef(): string {
  return ensureReferenceProgram('fastjet-ref');
}

export interface RefInputRecord {
  id?: string | number;
  weight?: number;
  /** px,py,pz,E interleaved (or pt,y,phi,m with momentum 'pt,y,phi,m'), in the file's energy unit. */
  particles: Float64Array | number[];
  pid?: ArrayLike<number>;
  charge?: ArrayLike<number>;
}

export interface RefInput {
  content: 'events' | 'jets';
  momentum?: MomentumConvention;
  energyUnit?: EnergyUnit;
  records: RefInputRecord[];
}

export interface RefOptions {
  algorithm?: Algorithm;
  R?: number;
  ptMin?: number;
  yMax?: number;
  maxJets?: number | null;
  all?: boolean;
  zCut?: number;
  beta?: number;
  R0?: number;
  sdMode?: 'grooming' | 'tagging';
  ktCut?: number;
  exclusive?: ExclusiveJets;
  /** e+e- jet finding (collision 'ee'). */
  ee?: EeJetDefinition;
  particles?: Partial<ConstituentSelection>;
}

export interface RefJet {
  rec: string | number;
  jet: number;
  pt: number;
  y: number;
  /** e+e- jets: energy and polar angle instead of pt and y. */
  E?: number;
  theta?: number;
  phi: number;
  m: number;
  n: number;
  weight: number;
  primary: number[][];
  all?: number[][];
  /** [m_g, z_g, R_g], NaN where the export has null. */
  sd: [number, number, number];
  mult: number;
  /** All SPLIT_FIELDS of types.ts per splitting. */
  primaryFull: number[][];
  allFull?: number[][];
}

export interface RefRecord {
  rec: string | number;
  rejected: { pt: number; y: number; rank: number };
  removed: Record<string, number>;
  /** FastJet's strategy for the jet finding (or the reclustering of a 'jets' record). */
  strategy: string;
  jets: RefJet[];
}

export interface RefOutput {
  header: Record<string, unknown>;
  records: RefRecord[];
  /** The raw export text. */
  text: string;
}

/** The ProcessSettings our engine gets for the same options as the reference (same defaults as fastjet-ref). */
export function settingsFor(content: 'events' | 'jets', o: RefOptions = {}): ProcessSettings {
  const R = o.R ?? 0.4;
  const s: ProcessSettings = {
    content,
    jet: { algorithm: o.algorithm ?? 'antikt', R, ptMin: o.ptMin ?? 20, yMax: o.yMax ?? 2.5, maxJets: o.maxJets ?? null },
    softDrop: { zCut: o.zCut ?? 0.1, beta: o.beta ?? 0, R0: o.R0 ?? R, mode: o.sdMode ?? 'grooming' },
    multiplicityKtCut: o.ktCut ?? 1,
    fullTree: o.all ?? false,
    collision: o.ee ? 'ee' : 'hadron',
    ee: o.ee,
    particles: { ...NO_SELECTION, ...o.particles },
  };
  if (o.exclusive) s.jet.exclusive = o.exclusive;
  return s;
}

function argsFor(o: RefOptions): string[] {
  const a: string[] = ['--debug'];
  if (o.algorithm) a.push('--algorithm', o.algorithm);
  if (o.R !== undefined) a.push('--R', String(o.R));
  if (o.ptMin !== undefined) a.push('--ptmin', String(o.ptMin));
  if (o.yMax !== undefined) a.push('--ymax', String(o.yMax));
  if (o.maxJets !== undefined && o.maxJets !== null) a.push('--njets', String(o.maxJets));
  if (o.all) a.push('--all');
  if (o.zCut !== undefined) a.push('--zcut', String(o.zCut));
  if (o.beta !== undefined) a.push('--beta', String(o.beta));
  if (o.R0 !== undefined) a.push('--R0', String(o.R0));
  if (o.sdMode !== undefined) a.push('--sdmode', o.sdMode);
  if (o.ktCut !== undefined) a.push('--ktcut', String(o.ktCut));
  const ex = o.exclusive;
  if (ex && 'n' in ex) a.push('--exclusive-n', String(ex.n));
  if (ex && 'dcut' in ex) a.push('--dcut', String(ex.dcut));
  if (ex && 'ycut' in ex) a.push('--ycut', String(ex.ycut));
  if (o.ee) a.push('--collision', 'ee', '--ee-algorithm', o.ee.algorithm, '--ee-p', String(o.ee.p), '--emin', String(o.ee.eMin));
  const sel = o.particles ?? {};
  if (sel.dropNeutrinos) a.push('--drop-neutrinos');
  if (sel.chargedOnly) a.push('--charged-only');
  if (sel.pidInclude?.length) a.push('--pid-include', sel.pidInclude.join(','));
  if (sel.pidExclude?.length) a.push('--pid-exclude', sel.pidExclude.join(','));
  if (sel.ptMin) a.push('--constituent-ptmin', String(sel.ptMin));
  if (sel.rapidityMax != null) a.push('--constituent-rapmax', String(sel.rapidityMax));
  if (sel.rapidityKind === 'eta') a.push('--constituent-eta');
  return a;
}

/** Serialises an input as splitfield-particles JSON Lines (numbers in shortest round-trip form). */
export function particlesFileText(input: RefInput): string {
  const header = {
    format: 'splitfield-particles',
    version: 1,
    content: input.content,
    momentum: input.momentum ?? 'px,py,pz,E',
    energyUnit: input.energyUnit ?? 'GeV',
    sample: { name: 'reference-test' },
  };
  const lines = [JSON.stringify(header)];
  input.records.forEach((r, i) => {
    const p = r.particles;
    const parts: string[] = [];
    for (let j = 0; j < p.length; j += 4) parts.push(`[${p[j]},${p[j + 1]},${p[j + 2]},${p[j + 3]}]`);
    const id = r.id ?? `r${i}`;
    const extra = (r.pid ? `,"pid":[${Array.from(r.pid).join(',')}]` : '') + (r.charge ? `,"charge":[${Array.from(r.charge).join(',')}]` : '');
    lines.push(`{"id":${JSON.stringify(id)},"weight":${r.weight ?? 1},"particles":[${parts.join(',')}]${extra}}`);
  });
  return lines.join('\n') + '\n';
}

const nanify = (v: number | null): number => (v === null ? NaN : v);
const nanifyRows = (rows: (number | null)[][] | undefined): number[][] | undefined => rows?.map((r) => r.map(nanify));

/** Parses fastjet-ref --debug output. */
export function parseRefOutput(text: string): RefOutput {
  const lines = text.split('\n').filter((l) => l.length > 0);
  const header = JSON.parse(lines[0]);
  const records: RefRecord[] = [];
  let pending: RefJet[] = [];
  for (let i = 1; i < lines.length; i++) {
    const o = JSON.parse(lines[i]);
    if (o.rejected) {
      records.push({ rec: o.rec, rejected: o.rejected, removed: o.removed, strategy: o.strategy, jets: pending });
      pending = [];
    } else {
      pending.push({
        ...o,
        pt: nanify(o.pt ?? null), y: nanify(o.y ?? null), phi: nanify(o.phi), m: nanify(o.m),
        E: o.E === undefined ? undefined : nanify(o.E), theta: o.theta === undefined ? undefined : nanify(o.theta),
        primary: nanifyRows(o.primary)!,
        all: nanifyRows(o.all),
        sd: o.sd.map(nanify),
        primaryFull: nanifyRows(o.primaryFull)!,
        allFull: nanifyRows(o.allFull),
      });
    }
  }
  return { header, records, text };
}

/** Runs the reference on an input; returns its parsed output. */
export function runFastjetRef(input: RefInput, o: RefOptions = {}): RefOutput {
  const bin = ensureFastjetRef();
  const dir = mkdtempSync(path.join(os.tmpdir(), 'splitfield-fjref-'));
  try {
    const inFile = path.join(dir, 'in.jsonl');
    const outFile = path.join(dir, 'out.jsonl');
    writeFileSync(inFile, particlesFileText(input));
    execFileSync(bin, [...argsFor(o), inFile, '--out', outFile], { stdio: 'pipe', maxBuffer: 1 << 28 });
    return parseRefOutput(readFileSync(outFile, 'utf8'));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
