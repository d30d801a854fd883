// Command line: splitfield decluster INPUT [options] (bin/splitfield.mjs runs this bundle; `npm run -s decluster --`
// is a shorthand).
// Reads a splitfield-particles (or HepMC3) file, finds/reclusters jets, declusters them and writes the
// splitfield-declusterings export (JSON Lines) to stdout or a file; counts and throughput go to stderr.

import { createWriteStream, promises as fsp } from 'node:fs';
import { Readable, type Writable } from 'node:stream';
import { parseArgs } from 'node:util';
import type { Algorithm } from '../physics/types';
import { IngestAbortError, IngestError } from './errors';
import { ExportWriter, SOFTWARE_VERSION } from './export';
import { defaultThreads, runPipeline, type PipelineSettings } from './pipeline/run';
import { ProgressLine, fmtInt } from './progress';
import { openParticleFile, openParticleStream } from './reader';

const USAGE = `Usage: splitfield decluster INPUT [options]
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
  --help, -h  --version
Exit codes: 0 done, 1 bad input or processing error, 2 usage error, 130 interrupted.`;

class UsageError extends Error {}

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
  settings: PipelineSettings;
}

const VALUE_OPTIONS = new Set(['--R', '--ptmin', '--ymax', '--njets', '--algorithm', '--zcut', '--beta', '--R0', '--sdmode', '--ktcut', '--threads', '--out', '-o']);

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
        threads: { type: 'string' },
        out: { type: 'string', short: 'o' },
        'skip-bad': { type: 'boolean' },
        progress: { type: 'boolean' },
        quiet: { type: 'boolean', short: 'q' },
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
  return {
    input: parsed.positionals[0],
    out: v.out ?? null,
    threads,
    skipBad: !!v['skip-bad'],
    progress: !!v.progress,
    quiet: !!v.quiet,
    settings: {
      jet: { algorithm, R, ptMin, yMax, maxJets: njets },
      softDrop: { zCut, beta, R0, mode: sdMode },
      multiplicityKtCut: ktCut,
      fullTree: !!v.all,
    },
  };
}

function rate(n: number, secs: number): string {
  return secs > 0 ? fmtInt(n / secs) : '-';
}

/** Runs the command; returns the exit code (0 ok, 1 input or processing error, 2 usage, 130 interrupted). */
export async function main(argv: string[]): Promise<number> {
  const err = process.stderr;
  let cfg: CliConfig;
  try {
    const c = parseCli(argv);
    if (c === 'help') {
      process.stdout.write(USAGE + '\n');
      return 0;
    }
    if (c === 'version') {
      process.stdout.write(`splitfield ${SOFTWARE_VERSION}\n`);
      return 0;
    }
    cfg = c;
  } catch (e) {
    if (e instanceof UsageError) {
      err.write(`decluster: ${e.message}\n${USAGE}\n`);
      return 2;
    }
    throw e;
  }

  const ac = new AbortController();
  const onSig = () => ac.abort();
  process.once('SIGINT', onSig);
  process.once('SIGTERM', onSig);

  let out: Writable;
  let tmpPath: string | null = null;
  let outClosed = false;
  let outError: Error | null = null;
  if (cfg.out && cfg.out !== '-') {
    tmpPath = `${cfg.out}.partial-${process.pid}`;
    out = createWriteStream(tmpPath);
  } else {
    out = process.stdout;
  }
  out.on('error', (e: NodeJS.ErrnoException) => {
    // A closed pipe (e.g. `| head`) ends the run quietly; other write errors are reported.
    outClosed = e.code === 'EPIPE';
    if (!outClosed) outError ??= e;
    ac.abort();
  });

  const bar = cfg.progress ? new ProgressLine(process.stderr) : null;
  let skippedShown = 0;
  try {
    const opts = {
      skipBad: cfg.skipBad,
      onSkip: (e: IngestError) => {
        if (!cfg.quiet && skippedShown < 5) {
          bar?.clear();
          err.write(`decluster: skipped ${e.message}\n`);
        }
        skippedShown++;
      },
    };
    const reader = cfg.input === '-' ? await openParticleStream(process.stdin as unknown as Readable, { ...opts, name: 'stdin' }) : await openParticleFile(cfg.input, opts);
    const writer = new ExportWriter(out, { inputName: cfg.input });
    const s = await runPipeline({
      reader,
      settings: cfg.settings,
      sink: writer,
      threads: cfg.threads,
      signal: ac.signal,
      onProgress: bar ? (p) => bar.update(p) : undefined,
    });
    bar?.clear();
    if (tmpPath) {
      await new Promise<void>((res, rej) => out.end((e?: Error | null) => (e ? rej(e) : res())));
      await fsp.rename(tmpPath, cfg.out!);
      tmpPath = null;
    } else {
      await new Promise<void>((res) => (out.writableNeedDrain ? out.once('drain', () => res()) : res()));
    }
    if (!cfg.quiet) {
      const secs = s.elapsedMs / 1000;
      const h = s.header;
      const what = `${h.format}${h.layout === 'document' ? ' (one document)' : ''}, ${h.content}${h.gzip ? ', gzip' : ''}`;
      const rss = process.resourceUsage().maxRSS / 1024;
      err.write(
        `decluster: ${cfg.input} (${what}) -> ${cfg.out ?? 'stdout'}\n` +
          `  records ${fmtInt(s.records)} (${fmtInt(s.particles)} particles), jets ${fmtInt(s.jets)}, primary splittings ${fmtInt(s.primarySplittings)}` +
          (cfg.settings.fullTree ? `, all splittings ${fmtInt(s.allSplittings)}` : '') +
          '\n' +
          (h.content === 'events' ? `  jets rejected: pt ${fmtInt(s.rejected.pt)}, |y| ${fmtInt(s.rejected.y)}, rank ${fmtInt(s.rejected.rank)}\n` : '') +
          `  time ${secs.toFixed(2)} s: ${rate(s.jets, secs)} jets/s, ${rate(s.records, secs)} records/s, ${rate(s.particles, secs)} particles/s, ` +
          `${(s.bytesRead / 1048576 / Math.max(secs, 1e-9)).toFixed(1)} MB/s read; threads ${s.threads}; peak RSS ${rss.toFixed(0)} MB\n` +
          (cfg.skipBad ? `  skipped ${fmtInt(s.skipped)} bad record${s.skipped === 1 ? '' : 's'}\n` : ''),
      );
    }
    return 0;
  } catch (e) {
    bar?.clear();
    if (tmpPath) {
      out.destroy();
      await fsp.rm(tmpPath, { force: true });
    }
    if (outClosed) return 0;
    if (outError) {
      err.write(`decluster: error: cannot write ${cfg.out ?? 'stdout'}: ${(outError as Error).message}\n`);
      return 1;
    }
    if (e instanceof IngestAbortError) {
      err.write(tmpPath ? 'decluster: interrupted; the output file was not written\n' : 'decluster: interrupted\n');
      return 130;
    }
    if (e instanceof IngestError) {
      err.write(`decluster: error: ${cfg.input}: ${e.message}\n`);
      return 1;
    }
    err.write(`decluster: internal error: ${e instanceof Error ? (e.stack ?? e.message) : String(e)}\n`);
    return 1;
  } finally {
    process.off('SIGINT', onSig);
    process.off('SIGTERM', onSig);
  }
}

if (require.main === module) {
  main(process.argv.slice(2)).then(
    (code) => {
      process.exitCode = code;
    },
    (e) => {
      process.stderr.write(`decluster: ${e?.stack ?? e}\n`);
      process.exitCode = 1;
    },
  );
}
