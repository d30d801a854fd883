// The options of `splitfield decluster` (the command line of cli.ts): usage text, parsing and checks into a
// CliConfig. Apart from cli.ts so that tools (the benchmark's physics timing) read the same options.

import { parseArgs } from 'node:util';
import type { Algorithm } from '../physics/types';
import { defaultThreads, type PipelineSettings } from './pipeline/run';
import { settingsInputSchema } from './settings';

export const USAGE = `Usage: splitfield decluster INPUT [options]
Reads INPUT (splitfield-particles JSON Lines or one document, or HepMC3 ASCII; gzip or plain; "-" for stdin),
declusters every selected jet with Cambridge/Aachen and writes the splitfield-declusterings export.

Jet finding (content "events") and selection:
  --algorithm antikt|kt|ca   jet algorithm (default antikt)
  --R 0.4                    jet radius
  --ptmin 20                 keep jets with pt > ptmin (GeV)
  --ymax 2.5                 keep jets with |y| < ymax
  --njets N                  keep at most the N leading jets of each record (default: all)
  --exclusive-n N            exclusive jets: the whole event clustered to exactly N jets (kt or ca; e+e- durham)
  --dcut D                   exclusive jets: cluster until the distance exceeds D (kt: GeV^2; ca: dimensionless)
  --ycut Y                   e+e- exclusive jets: until y = d / E_vis^2 exceeds Y (durham, cambridge)
                             (default: inclusive jets)
Lepton collider (e+e-) events:
  --collision hadron|ee      collision type (default hadron: pt, rapidity, azimuth; ee: energy and angles)
  --ee-algorithm A           durham (needs --exclusive-n or --ycut), cambridge (needs --ycut) or genkt
                             (inclusive, radius --R) (default durham)
  --ee-p P                   exponent p of genkt: 1 kt-like, 0 C/A-like, -1 anti-kt-like (default -1)
  --emin E                   keep e+e- jets with energy > E (GeV) (default 0); --ptmin and --ymax do not apply
Constituents (before jet finding; removed particles are counted by rule):
  --charged-only             charged particles only ("charge" of the record, else from "pid") (default off)
  --constituent-ptmin X      particles with pt > X (GeV) (default 0: all)
  --constituent-ymax X       particles with |y| < X (default: no limit)
  --constituent-etamax X     particles with |eta| < X instead (default: no limit)
  --pid-include LIST         only these particle codes, comma-separated; a code covers its antiparticle (default: all)
  --pid-exclude LIST         drop these particle codes (default: none)
  --drop-neutrinos           drop neutrinos (|pid| 12, 14, 16, 18) (default off)
Flavour:
  --flavour-tags             tag jets b, c or light by ghost association of the tag hadrons (HepMC3 status-2
                             hadrons, or the records' "tagParticles"/"tagPid") (default off)
Observables:
  --zcut 0.1  --beta 0  --R0 R   SoftDrop parameters (R0 defaults to R)
  --sdmode grooming          SoftDrop mode: grooming (a jet no splitting passes keeps its last constituent,
                             z_g = R_g = 0) or tagging (such a jet fails: m_g, z_g, R_g are null)
  --ktcut 1                  kt cut (GeV) of the primary emission multiplicity
  --all                      also write every splitting of the C/A tree ("all")
Running:
  --threads N                worker threads (default: the number of cores, ${defaultThreads()} here)
  --out FILE, -o FILE        write the export to FILE (default: stdout)
  --skip-bad                 skip bad records and report how many, instead of stopping at the first
  --progress                 show a progress bar on stderr
  --quiet, -q                no report on stderr (errors are still printed)
  --timings                  also print where the time went (seconds a stage) on stderr, one JSON line
  --help, -h  --version
Exit codes: 0 done, 1 bad input or processing error, 2 usage error, 130 interrupted.`;

export class UsageError extends Error {}

function numberOption(name: string, v: string | undefined, def: number, check: (x: number) => boolean, rule: string): number {
  if (v === undefined) return def;
  const x = Number(v);
  if (v.trim() === '' || !Number.isFinite(x) || !check(x)) throw new UsageError(`--${name} ${v}: must be ${rule}`);
  return x;
}

export interface CliConfig {
  input: string;
  out: string | null;
  threads: number;
  skipBad: boolean;
  progress: boolean;
  quiet: boolean;
  timings: boolean;
  settings: PipelineSettings;
}

const VALUE_OPTIONS = new Set([
  '--R', '--ptmin', '--ymax', '--njets', '--algorithm', '--zcut', '--beta', '--R0', '--sdmode', '--ktcut', '--threads', '--out', '-o',
  '--exclusive-n', '--dcut', '--ycut', '--collision', '--ee-algorithm', '--ee-p', '--emin', '--constituent-ptmin',
  '--constituent-ymax', '--constituent-etamax', '--pid-include', '--pid-exclude',
]);

/** "--beta -1" → "--beta=-1" (parseArgs takes a value starting with a dash for an option). */
function joinNegativeValues(argv: string[]): string[] {
  const out: string[] = [];
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    const next = argv[i + 1];
    if (VALUE_OPTIONS.has(a) && next !== undefined && /^-(\d|\.\d|Infinity)/.test(next)) {
      out.push(`${a}=${next}`);
      i++;
    } else out.push(a);
  }
  return out;
}

export function parseCli(argv: string[]): CliConfig | 'help' | 'version' {
  let parsed;
  try {
    parsed = parseArgs({
      args: joinNegativeValues(argv),
      allowPositionals: true,
      strict: true,
      options: {
        R: { type: 'string' },
        ptmin: { type: 'string' },
        ymax: { type: 'string' },
        njets: { type: 'string' },
        algorithm: { type: 'string' },
        zcut: { type: 'string' },
        beta: { type: 'string' },
        R0: { type: 'string' },
        sdmode: { type: 'string' },
        ktcut: { type: 'string' },
        all: { type: 'boolean' },
        'exclusive-n': { type: 'string' },
        dcut: { type: 'string' },
        ycut: { type: 'string' },
        collision: { type: 'string' },
        'ee-algorithm': { type: 'string' },
        'ee-p': { type: 'string' },
        emin: { type: 'string' },
        'charged-only': { type: 'boolean' },
        'constituent-ptmin': { type: 'string' },
        'constituent-ymax': { type: 'string' },
        'constituent-etamax': { type: 'string' },
        'pid-include': { type: 'string' },
        'pid-exclude': { type: 'string' },
        'drop-neutrinos': { type: 'boolean' },
        'flavour-tags': { type: 'boolean' },
        threads: { type: 'string' },
        out: { type: 'string', short: 'o' },
        'skip-bad': { type: 'boolean' },
        progress: { type: 'boolean' },
        quiet: { type: 'boolean', short: 'q' },
        timings: { type: 'boolean' },
        help: { type: 'boolean', short: 'h' },
        version: { type: 'boolean' },
      },
    });
  } catch (e) {
    throw new UsageError((e as Error).message);
  }
  const v = parsed.values;
  if (v.help) return 'help';
  if (v.version) return 'version';
  if (parsed.positionals.length !== 1) {
    throw new UsageError(parsed.positionals.length === 0 ? 'no INPUT file given' : `one INPUT file expected, got ${parsed.positionals.length}: ${parsed.positionals.join(' ')}`);
  }
  const algorithm = (v.algorithm ?? 'antikt') as Algorithm;
  if (!['antikt', 'kt', 'ca'].includes(algorithm)) throw new UsageError(`--algorithm ${v.algorithm}: must be antikt, kt or ca`);
  const R = numberOption('R', v.R, 0.4, (x) => x > 0 && x <= 10, 'a number in (0, 10]');
  const ptMin = numberOption('ptmin', v.ptmin, 20, (x) => x >= 0, 'a number >= 0 (GeV)');
  const yMax = numberOption('ymax', v.ymax, 2.5, (x) => x > 0, 'a number > 0');
  const njets = v.njets === undefined ? null : numberOption('njets', v.njets, 0, (x) => Number.isInteger(x) && x >= 1, 'an integer >= 1');
  const zCut = numberOption('zcut', v.zcut, 0.1, (x) => x >= 0 && x < 1, 'a number in [0, 1)');
  const beta = numberOption('beta', v.beta, 0, () => true, 'a number');
  const R0 = numberOption('R0', v.R0, R, (x) => x > 0, 'a number > 0');
  const sdMode = v.sdmode ?? 'grooming';
  if (sdMode !== 'grooming' && sdMode !== 'tagging') throw new UsageError(`--sdmode ${sdMode}: must be grooming or tagging`);
  const ktCut = numberOption('ktcut', v.ktcut, 1, (x) => x >= 0, 'a number >= 0 (GeV)');
  const threads = numberOption('threads', v.threads, defaultThreads(), (x) => Number.isInteger(x) && x >= 1 && x <= 256, 'an integer >= 1');
  const exclusiveGiven = [v['exclusive-n'], v.dcut, v.ycut].filter((x) => x !== undefined).length;
  if (exclusiveGiven > 1) throw new UsageError('give at most one of --exclusive-n, --dcut and --ycut');
  if (v['constituent-ymax'] !== undefined && v['constituent-etamax'] !== undefined) throw new UsageError('give --constituent-ymax or --constituent-etamax, not both');
  const rapidityText = v['constituent-ymax'] ?? v['constituent-etamax'];
  const candidate = {
    jet: {
      algorithm, R, ptMin, yMax, maxJets: njets,
      exclusive:
        v['exclusive-n'] !== undefined ? { n: numberOption('exclusive-n', v['exclusive-n'], 0, (x) => Number.isInteger(x) && x >= 1, 'an integer >= 1') }
        : v.dcut !== undefined ? { dcut: numberOption('dcut', v.dcut, 0, (x) => x > 0, 'a number > 0') }
        : v.ycut !== undefined ? { ycut: numberOption('ycut', v.ycut, 0, (x) => x > 0, 'a number > 0') }
        : null,
    },
    softDrop: { zCut, beta, R0, mode: sdMode },
    multiplicityKtCut: ktCut,
    fullTree: !!v.all,
    collision: v.collision ?? 'hadron',
    ee: {
      algorithm: v['ee-algorithm'] ?? 'durham',
      p: numberOption('ee-p', v['ee-p'], -1, () => true, 'a number'),
      eMin: numberOption('emin', v.emin, 0, (x) => x >= 0, 'a number >= 0 (GeV)'),
    },
    particles: {
      dropNeutrinos: !!v['drop-neutrinos'],
      pidExclude: pidList('pid-exclude', v['pid-exclude']),
      pidInclude: pidList('pid-include', v['pid-include']),
      chargedOnly: !!v['charged-only'],
      ptMin: numberOption('constituent-ptmin', v['constituent-ptmin'], 0, (x) => x >= 0, 'a number >= 0 (GeV)'),
      rapidityMax: rapidityText === undefined ? null : numberOption(v['constituent-ymax'] !== undefined ? 'constituent-ymax' : 'constituent-etamax', rapidityText, 0, (x) => x > 0, 'a number > 0'),
      rapidityKind: v['constituent-etamax'] !== undefined ? 'eta' : 'y',
    },
    flavourTags: !!v['flavour-tags'],
  };
  return {
    input: parsed.positionals[0],
    out: v.out ?? null,
    threads,
    skipBad: !!v['skip-bad'],
    progress: !!v.progress,
    quiet: !!v.quiet,
    timings: !!v.timings,
    settings: checkedSettings(candidate),
  };
}

function pidList(name: string, text: string | undefined): number[] {
  if (text === undefined) return [];
  const codes = text.split(',').map((t) => t.trim());
  for (const c of codes) if (!/^-?\d+$/.test(c)) throw new UsageError(`--${name} ${text}: must be particle codes separated by commas, e.g. 12,14,16`);
  return codes.map(Number);
}

/** The command's settings through the same rules as the server's (lib/ingest/settings.ts), as usage errors. */
function checkedSettings(candidate: unknown): PipelineSettings {
  const r = settingsInputSchema.safeParse(candidate);
  if (r.success) return r.data;
  throw new UsageError(r.error.issues.map((i) => i.message).join('; '));
}
