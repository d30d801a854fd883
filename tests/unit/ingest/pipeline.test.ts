// The processing pipeline and the export writer: threads = 2 byte-identical to threads = 1 and in the same
// order, the same export whatever the input layout (plain, gzip, one document, HepMC3), bad records with the
// same message in every mode, skip-bad counts, progress, cancellation, and the export's shape.
import { execFileSync } from 'node:child_process';
import { rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { Writable } from 'node:stream';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { processParticles } from '@/lib/physics/process';
import { generateEvents, generateJets } from '@/tests/support/test-events';
import { SPLIT_STRIDE, type ProcessSettings } from '@/lib/physics/types';
import { IngestError } from '@/lib/ingest/errors';
import { ExportWriter, PRIMARY_COLUMNS } from '@/lib/ingest/export';
import { runPipeline, type PipelineOptions, type PipelineSettings } from '@/lib/ingest/pipeline/run';
import { openParticleFile } from '@/lib/ingest/reader';
import type { PipelineProgress } from '@/lib/ingest/pipeline/sink';
import type { ReaderOptions } from '@/lib/ingest/types';
import { HEADER, gz, hepmc3Text, jsonl, tempDir, toRows } from './helpers';

const ROOT = path.resolve(__dirname, '../../..');
const t = tempDir('sf-pipe-');
// The engine bundle of this test file, in its own directory inside the project (so that the bundle finds the
// installed piscina; parallel test files never share a bundle that is being rebuilt).
const ENGINE = path.join(ROOT, 'tests/artifacts', `engine-pipeline-${process.pid}`);
const WORKER = path.join(ENGINE, 'worker.js');

beforeAll(() => {
  execFileSync('node', ['scripts/build-engine.mjs', '--outdir', ENGINE], { cwd: ROOT, stdio: 'pipe' });
});
afterAll(() => {
  t.cleanup();
  rmSync(ENGINE, { recursive: true, force: true });
});

const SETTINGS: PipelineSettings = {
  jet: { algorithm: 'antikt', R: 0.4, ptMin: 20, yMax: 2.5, maxJets: null },
  softDrop: { zCut: 0.1, beta: 0, R0: 0.4 },
  multiplicityKtCut: 1,
  fullTree: true,
};

class Collect extends Writable {
  chunks: string[] = [];
  _write(chunk: Buffer, _enc: BufferEncoding, cb: () => void) {
    this.chunks.push(chunk.toString());
    cb();
  }
  get text() {
    return this.chunks.join('');
  }
}

async function exportOf(file: string, extra: Partial<PipelineOptions> & { readerOpts?: ReaderOptions } = {}) {
  const { readerOpts, ...rest } = extra;
  const reader = await openParticleFile(file, readerOpts ?? {});
  const out = new Collect();
  const progress: PipelineProgress[] = [];
  const summary = await runPipeline({
    reader,
    settings: SETTINGS,
    sink: new ExportWriter(out),
    threads: 1,
    workerFile: WORKER,
    onProgress: (p) => progress.push(p),
    progressIntervalMs: 0,
    ...rest,
  });
  return { text: out.text, summary, progress };
}

const events = generateEvents(2024, 60, { nParticles: 150, nJets: 3, massiveFraction: 0.3 });
const eventRecords = events.map((p, i) => ({ id: i, weight: 1 + (i % 3), particles: toRows(p) }));
const jets = generateJets(7, 80, { nConstituents: 30, nearPhiWrap: true });

describe('pipeline', () => {
  it('threads = 2 gives byte-identical output to threads = 1, in the same order (events and jets)', async () => {
    const f = t.file('ev.jsonl', jsonl(HEADER, eventRecords));
    const one = await exportOf(f);
    expect(one.summary.jets).toBeGreaterThan(60);
    for (const batchChars of [1 << 20, 5000]) {
      const two = await exportOf(f, { threads: 2, batchChars });
      expect(two.text).toBe(one.text);
      expect(two.summary.jets).toBe(one.summary.jets);
    }
    // packed tasks (records parsed in this thread: one-document form)
    const doc = t.file('ev.json', JSON.stringify({ ...HEADER, records: eventRecords }));
    const twoDoc = await exportOf(doc, { threads: 2, batchParticles: 500 });
    expect(twoDoc.text).toBe(one.text);

    const jf = t.file('jets.jsonl', jsonl({ ...HEADER, content: 'jets' }, jets.map((p, i) => ({ id: `j${i}`, particles: toRows(p) }))));
    const j1 = await exportOf(jf);
    const j2 = await exportOf(jf, { threads: 2, batchChars: 3000 });
    expect(j2.text).toBe(j1.text);
    expect(j1.summary.records).toBe(80);
  });

  it('gives the same export from plain, gzip, one document and HepMC3 input', async () => {
    const text = jsonl(HEADER, eventRecords);
    const plain = await exportOf(t.file('a.jsonl', text));
    const gzip = await exportOf(t.file('a.jsonl.gz', gz(text)));
    const doc = await exportOf(t.file('a.json', JSON.stringify({ ...HEADER, records: eventRecords }, null, 1)));
    expect(gzip.text).toBe(plain.text);
    expect(doc.text).toBe(plain.text);
    const hep = await exportOf(t.file('a.hepmc', hepmc3Text(events, { weights: events.map((_, i) => 1 + (i % 3)) })));
    const body = (s: string) => s.split('\n').slice(1).join('\n');
    expect(body(hep.text)).toBe(body(plain.text));
    // HepMC3 event blocks are parsed in the worker threads too
    const hep2 = await exportOf(t.file('a2.hepmc.gz', gz(hepmc3Text(events, { weights: events.map((_, i) => 1 + (i % 3)) }))), { threads: 2, batchChars: 20000 });
    expect(body(hep2.text)).toBe(body(plain.text));
  });

  it('writes what processParticles computed, in the export format', async () => {
    const f = t.file('fmt.jsonl', jsonl(HEADER, eventRecords.slice(0, 10)));
    const { text } = await exportOf(f);
    const lines = text.trim().split('\n').map((l) => JSON.parse(l));
    const head = lines[0];
    expect(head).toMatchObject({
      format: 'splitfield-declusterings',
      version: 1,
      content: 'events',
      jetDefinition: { algorithm: 'antikt', R: 0.4 },
      cuts: { ptMin: 20, yMax: 2.5, maxJets: null },
      softDrop: { zCut: 0.1, beta: 0, R0: 0.4 },
      multiplicityKtCut: 1,
      software: { name: 'splitfield' },
      input: { format: 'splitfield-particles', sample: HEADER.sample },
    });
    const settings: ProcessSettings = { ...SETTINGS, content: 'events' };
    let k = 1;
    for (let r = 0; r < 10; r++) {
      const res = processParticles(events[r], settings);
      res.jets.forEach((jet, j) => {
        const line = lines[k++];
        expect(Object.keys(line)).toEqual(['rec', 'jet', 'pt', 'y', 'phi', 'm', 'n', 'weight', 'primary', 'all', 'sd', 'mult']);
        expect([line.rec, line.jet, line.pt, line.y, line.phi, line.m, line.n, line.weight]).toEqual([r, j, jet.pt, jet.y, jet.phi, jet.m, jet.n, 1 + (r % 3)]);
        expect(line.primary.length).toBe(jet.primary.length / SPLIT_STRIDE);
        line.primary.forEach((row: number[], i: number) => {
          expect(row.length).toBe(PRIMARY_COLUMNS.length);
          expect(row).toEqual(Array.from(jet.primary.subarray(i * SPLIT_STRIDE, i * SPLIT_STRIDE + 7)));
        });
        expect(line.all.length).toBe(jet.all!.length / SPLIT_STRIDE);
        line.all.forEach((row: number[], i: number) => {
          const s = jet.all!.subarray(i * SPLIT_STRIDE);
          expect(row).toEqual([s[8], s[0], s[1], s[2]]);
        });
        const sd = [jet.softDrop.mg, jet.softDrop.zg, jet.softDrop.Rg].map((x) => (Number.isFinite(x) ? x : null));
        expect(line.sd).toEqual(sd);
        expect(line.mult).toBe(jet.multiplicity);
      });
    }
    expect(k).toBe(lines.length);
    // without --all: no "all" field
    const noAll = await exportOf(f, { settings: { ...SETTINGS, fullTree: false } });
    expect(JSON.parse(noAll.text.split('\n')[1])).not.toHaveProperty('all');
  });

  it('a bad record gives the same error with threads 1 and 2; skip-bad gives the same export and count', async () => {
    const recs: unknown[] = eventRecords.slice(0, 30).map((r) => JSON.stringify(r));
    recs[12] = JSON.stringify({ id: 'bad', particles: [[1, 2, 3, 10], [0, 0, 4, 4]] }); // line 14, particle 1
    recs[20] = '{"id":"nan","particles":[[1,2,3,NaN]]}'; // line 22
    const f = t.file('bad.jsonl', jsonl(HEADER, recs));
    const errs: string[] = [];
    for (const threads of [1, 2]) {
      try {
        await exportOf(f, { threads, batchChars: 4000 });
        throw new Error('no error');
      } catch (e) {
        expect(e).toBeInstanceOf(IngestError);
        errs.push((e as Error).message);
      }
    }
    expect(errs[0]).toMatch(/^line 14, particle 1: no finite rapidity/);
    expect(errs[1]).toBe(errs[0]);
    const skipped: string[][] = [];
    const outs = [];
    for (const threads of [1, 2]) {
      const seen: string[] = [];
      const r = await exportOf(f, { threads, batchChars: 4000, readerOpts: { skipBad: true, onSkip: (e) => seen.push(e.message) } });
      expect(r.summary.skipped).toBe(2);
      expect(r.summary.records).toBe(28);
      skipped.push(seen);
      outs.push(r.text);
    }
    expect(outs[1]).toBe(outs[0]);
    expect(skipped[1]).toEqual(skipped[0]);
    expect(skipped[0].map((m) => m.split(':')[0])).toEqual(['line 14, particle 1', 'line 22, particle 0']);
  });

  it('reports progress, and a cancelled run stops with an AbortError and tells the sink', async () => {
    const f = t.file('prog.jsonl.gz', gz(jsonl(HEADER, eventRecords)));
    const { progress, summary } = await exportOf(f, { batchRecords: 5 });
    expect(progress.length).toBeGreaterThan(5);
    const last = progress[progress.length - 1];
    expect(last.done).toBe(true);
    expect([last.records, last.jets, last.primarySplittings, last.bytesRead]).toEqual([60, summary.jets, summary.primarySplittings, summary.bytesTotal]);
    expect(progress.every((p, i) => i === 0 || p.records >= progress[i - 1].records)).toBe(true);

    for (const threads of [1, 2]) {
      const ac = new AbortController();
      const reader = await openParticleFile(f);
      let aborted: unknown = null;
      const sink = new ExportWriter(new Collect());
      (sink as unknown as { abort: (e: unknown) => void }).abort = (e) => {
        aborted = e;
      };
      const run = runPipeline({
        reader,
        settings: SETTINGS,
        sink,
        threads,
        workerFile: WORKER,
        batchRecords: 3,
        batchChars: 5000,
        signal: ac.signal,
        progressIntervalMs: 0,
        onProgress: (p) => {
          if (p.records >= 9) ac.abort();
        },
      });
      await expect(run).rejects.toMatchObject({ name: 'AbortError' });
      expect(aborted).toMatchObject({ name: 'AbortError' });
    }
  });

  it('a worker thread that cannot start fails the run at once (piscina would leave the tasks pending)', async () => {
    const broken = path.join(t.dir, 'broken-worker.js');
    writeFileSync(broken, "require('a-package-that-is-not-installed'); module.exports = () => null;\n");
    const f = t.file('w.jsonl', jsonl(HEADER, eventRecords));
    const t0 = performance.now();
    await expect(exportOf(f, { threads: 2, workerFile: broken, batchChars: 3000 })).rejects.toThrow(/Cannot find module 'a-package-that-is-not-installed'/);
    expect(performance.now() - t0).toBeLessThan(20_000);
  });
});
