// Command line: splitfield decluster INPUT [options] (bin/splitfield.mjs runs this bundle; `npm run -s decluster --`
// is a shorthand).
// Reads a splitfield-particles (or HepMC3) file, finds/reclusters jets, declusters them and writes the
// splitfield-declusterings export (JSON Lines) to stdout or a file; counts and throughput go to stderr.

import { createWriteStream, promises as fsp } from 'node:fs';
import { Readable, type Writable } from 'node:stream';
import { IngestAbortError, IngestError } from './errors';
import { ExportWriter, SOFTWARE_VERSION } from './export';
import { USAGE, UsageError, parseCli, type CliConfig } from './cli-options';
import { runPipeline } from './pipeline/run';
import { ProgressLine, fmtInt } from './progress';
import { openParticleFile, openParticleStream } from './reader';

/** Output file buffer: batches queue here while the file system writes (memory stays bounded by it). */
const OUT_BUFFER_BYTES = 8 << 20;

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
    // A deep buffer lets the file system write one batch while the next is computed (the default 16 KiB made
    // every batch wait for its own write: a sixth of a one-thread run).
    out = createWriteStream(tmpPath, { highWaterMark: OUT_BUFFER_BYTES });
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
      timings: cfg.timings,
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
          (h.content === 'events'
            ? cfg.settings.collision === 'ee'
              ? `  jets rejected: energy ${fmtInt(s.rejected.pt)}, rank ${fmtInt(s.rejected.rank)}\n`
              : `  jets rejected: pt ${fmtInt(s.rejected.pt)}, |y| ${fmtInt(s.rejected.y)}, rank ${fmtInt(s.rejected.rank)}\n`
            : '') +
          (cfg.settings.jet.exclusive ? `  exclusive jets: ${JSON.stringify(cfg.settings.jet.exclusive)}\n` : '') +
          (s.particlesRemoved ? `  particles removed: ${Object.entries(s.particlesRemoved).map(([k, n]) => `${k} ${fmtInt(n)}`).join(', ')}\n` : '') +
          (s.flavours ? `  jet flavours: b ${fmtInt(s.flavours.b)}, c ${fmtInt(s.flavours.c)}, light ${fmtInt(s.flavours.light)}\n` : '') +
          `  time ${secs.toFixed(2)} s: ${rate(s.jets, secs)} jets/s, ${rate(s.records, secs)} records/s, ${rate(s.particles, secs)} particles/s, ` +
          `${(s.bytesRead / 1048576 / Math.max(secs, 1e-9)).toFixed(1)} MB/s read; threads ${s.threads}; peak RSS ${rss.toFixed(0)} MB\n` +
          (cfg.skipBad ? `  skipped ${fmtInt(s.skipped)} bad record${s.skipped === 1 ? '' : 's'}\n` : ''),
      );
    }
    if (s.stages) {
      const round = (x: number) => Math.round(x * 1e4) / 1e4;
      const stages = Object.fromEntries(Object.entries(s.stages).map(([k, v]) => [k, round(v)]));
      err.write(`decluster timings: ${JSON.stringify({ ...stages, total: round(s.elapsedMs / 1000), threads: s.threads })}\n`);
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
