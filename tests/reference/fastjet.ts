// Test helper around tests/reference/fastjet-ref.cc (Reference: FastJet 3.4.0 (Debian libfastjet-dev)):
// compiles it when the binary is missing or older than the source, writes a splitfield-particles input file,
// runs it, and parses its splitfield-declusterings output (with its --debug extras).

import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, renameSync, rmSync, statSync, writeFileSync, readFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Algorithm, ProcessSettings } from '../../lib/physics/types';
import type { EnergyUnit, MomentumConvention } from '../../lib/physics/fourvector';

const here = path.dirname(fileURLToPath(import.meta.url));
export const FASTJET_REF_SOURCE = path.join(here, 'fastjet-ref.cc');
export const FASTJET_REF_BIN = path.join(here, 'bin', 'fastjet-ref');

/** Builds the reference program if needed; returns the binary's path. Safe with parallel test files. */
export function ensureFastjetRef(): string {
  const fresh = existsSync(FASTJET_REF_BIN) && statSync(FASTJET_REF_BIN).mtimeMs >= statSync(FASTJET_REF_SOURCE).mtimeMs;
  if (fresh) return FASTJET_REF_BIN;
  if (!existsSync('/usr/include/fastjet/ClusterSequence.hh') || !existsSync('/usr/include/nlohmann/json.hpp')) {
    throw new Error(
      'The FastJet reference needs Debian packages libfastjet-dev libfastjettools-dev nlohmann-json3-dev ' +
        '(scripts/ensure-debian-packages.sh installs them).',
    );
  }
  mkdirSync(path.dirname(FASTJET_REF_BIN), { recursive: true });
  const tmp = `${FASTJET_REF_BIN}.${process.pid}.tmp`;
  execFileSync('g++', ['-O2', '-std=c++17', '-o', tmp, FASTJET_REF_SOURCE, '-lfastjettools', '-lfastjet'], { stdio: 'pipe' });
  renameSync(tmp, FASTJET_REF_BIN);
  return FASTJET_REF_BIN;
}

export interface RefInputRecord {
  id?: string | number;
  weight?: number;
  /** px,py,pz,E interleaved (or pt,y,phi,m with momentum 'pt,y,phi,m'), in the file's energy unit. */
  particles: Float64Array | number[];
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
}

export interface RefJet {
  rec: string | number;
  jet: number;
  pt: number;
  y: number;
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
  return {
    content,
    jet: { algorithm: o.algorithm ?? 'antikt', R, ptMin: o.ptMin ?? 20, yMax: o.yMax ?? 2.5, maxJets: o.maxJets ?? null },
    softDrop: { zCut: o.zCut ?? 0.1, beta: o.beta ?? 0, R0: o.R0 ?? R, mode: o.sdMode ?? 'grooming' },
    multiplicityKtCut: o.ktCut ?? 1,
    fullTree: o.all ?? false,
  };
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
    lines.push(`{"id":${JSON.stringify(id)},"weight":${r.weight ?? 1},"particles":[${parts.join(',')}]}`);
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
      records.push({ rec: o.rec, rejected: o.rejected, strategy: o.strategy, jets: pending });
      pending = [];
    } else {
      pending.push({
        ...o,
        pt: nanify(o.pt), y: nanify(o.y), phi: nanify(o.phi), m: nanify(o.m),
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
