// The options of `splitfield decluster` (the command line of cli.ts): usage text, parsing and checks into a
// CliConfig. Apart from cli.ts so that tools (the benchmark's physics timing) read the same options.

import { parseArgs } from 'node:util';
import type { Algorithm } from '../physics/types';
import { defaultThreads, type PipelineSettings } from './pipeline/run';

export const USAGE = `Usage: splitfield decluster INPUT [options]
Reads INPUT (splitfield-particles JSON Lines or one document, or HepMC3 ASCII; gzip or plain; "-" for stdin),
declusters every selected jet with Cambridge/Aachen and writes the splitfield-declusterings export.

Jet finding (content "events") and selection:
  --algorithm antikt|kt|ca   jet algorithm (default antikt)
  --R 0.4                    jet radius
  --ptmin 20                 keep jets with pt > ptmin (GeV)
  --ymax 2.5                 keep jets with |y| < ymax
  --njets N                  keep at most the N leading jets of each record (default: all)
Observables:
  --zcut 0.1  --beta 0  --R0 R   SoftDrop parameters (R0 defaults to R)
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

const VALUE_OPTIONS = new Set(['--R', '--ptmin', '--ymax', '--njets', '--algorithm', '--zcut', '--beta', '--R0', '--ktcut', '--threads', '--out', '-o']);

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
        ktcut: { type: 'string' },
        all: { type: 'boolean' },
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
  const ktCut = numberOption('ktcut', v.ktcut, 1, (x) => x >= 0, 'a number >= 0 (GeV)');
  const threads = numberOption('threads', v.threads, defaultThreads(), (x) => Number.isInteger(x) && x >= 1 && x <= 256, 'an integer >= 1');
  return {
    input: parsed.positionals[0],
    out: v.out ?? null,
    threads,
    skipBad: !!v['skip-bad'],
    progress: !!v.progress,
    quiet: !!v.quiet,
    timings: !!v.timings,
    settings: {
      jet: { algorithm, R, ptMin, yMax, maxJets: njets },
      softDrop: { zCut, beta, R0 },
      multiplicityKtCut: ktCut,
      fullTree: !!v.all,
    },
  };
}

