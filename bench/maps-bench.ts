// Maps benchmark, through the server: two generated samples of 1 000 000 jets each (quark-like and gluon-like, from
// the emission generator) are uploaded with an API token and processed; then maps, contrasts and projections are
// asked for, each time with settings the server has not answered yet (so no answer comes from the result cache):
//   "from the cache"   new bins and ranges of the default selection: rebinned from the fine histograms cached at
//                      processing (the jet table is read once for the summary and kept);
//   "new filter"       a filter expression not used before: the selection and the plane recomputed from the stored
//                      columns (kept in memory after the first use, as a running server has them).
// Each figure is the time from sending the request to the end of the answer over loopback (the server's time plus
// sending the JSON), p50 and p95 over the repeats, and the server's CPU time for the request (from /proc; the
// requests go one at a time, so it is that request's work: steadier than wall time when other work shares the
// machine's two cores); and the server's memory (resident set of its process tree).
//
//   npm run bench:maps [-- --jets 1000000] [-- --repeats 30]
//
// Separation of the two samples (issue 10): "new threshold" changes the entries threshold: the training maps, the
// ln-ratio table, the score of every evaluation jet, its ROC, the score distributions and the region finder are
// computed again (the six single-variable taggers depend on the selection only and are kept); "new filter" changes
// the jet selection, so everything is computed again, the single-variable taggers' six ROCs too.
//
// Goals (issue 9): p95 under 50 ms from the cache, under 1 s with a new filter on 10^6 jets; (issue 10) a separation
// of two 10^6-jet samples under 2 s.
import { existsSync, mkdirSync, statSync } from 'node:fs';
import { loadavg } from 'node:os';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { demoSampleSpec } from '../lib/demo/scenario';
import { writeGeneratedSampleFile } from '../lib/ingest/generated-sample-file';
import type { Parton } from '../lib/physics/lo-density';
import { signIn, startTestServer } from '../tests/support/server';
import { cpuMs, curlUpload, peakKb, treeKb, waitForJobs } from './server-tools';

const ROOT = path.resolve(__dirname, '..');
const GOAL_CACHE_MS = 50;
const GOAL_FILTER_MS = 1000;
const GOAL_SEPARATION_MS = 2000;

const { values: args } = parseArgs({ options: { jets: { type: 'string', default: '1000000' }, repeats: { type: 'string', default: '30' } } });
const jets = Number(args.jets);
const repeats = Number(args.repeats);
for (const [name, value] of Object.entries({ jets, repeats })) {
  if (!Number.isInteger(value) || value < 1) throw new Error(`--${name} must be a whole number >= 1 (got ${value})`);
}

const log = (text: string) => process.stderr.write(`${text}\n`);

/** The demo study's jets (500 GeV, R = 0.8, hard-collinear emissions above 1 GeV, a light soft background). */
function spec(parton: Parton) {
  return { ...demoSampleSpec(parton), name: `Benchmark ${parton}-like jets`, label: `bench-${parton}` };
}

async function inputFile(parton: Parton): Promise<string> {
  const file = path.join(ROOT, 'bench/out', `maps-${parton}-${jets}.jsonl`);
  if (!existsSync(file)) {
    mkdirSync(path.dirname(file), { recursive: true });
    log(`generating ${path.relative(ROOT, file)} (${jets} jets)…`);
    await writeGeneratedSampleFile(file, spec(parton), jets, parton === 'quark' ? 9101 : 9102);
  }
  return file;
}

function percentile(values: number[], p: number): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

async function main(): Promise<void> {
  const files = { quark: await inputFile('quark'), gluon: await inputFile('gluon') };
  const server = await startTestServer({ demoJets: 100 });
  try {
    const { email, password } = server.credentials.admin;
    const admin = await signIn(server.baseUrl, email, password);
    const token = (await admin.post('/api/tokens', { name: 'maps benchmark' })).body.secret as string;
    const study = (await admin.post('/api/studies', { title: 'Maps benchmark' })).body.study.id as number;
    const idle = (samples: any[]) => samples.every((sample) => !['queued', 'running'].includes(sample.state));
    await waitForJobs(server, token, idle);
    const ids: number[] = [];
    for (const parton of ['quark', 'gluon'] as const) {
      log(`uploading and processing ${path.relative(ROOT, files[parton])} (${(statSync(files[parton]).size / 1048576).toFixed(0)} MB)…`);
      ids.push((await curlUpload(server, token, files[parton], { studyId: study, name: spec(parton).name, settings: '{"jet":{"R":0.8}}' })).sample.id);
    }
    const samples = await waitForJobs(server, token, idle);
    for (const id of ids) {
      const sample = samples.find((s) => s.id === id);
      if (sample.state !== 'done') throw new Error(`sample ${id} ended ${sample.state}: ${JSON.stringify(sample.error)}`);
      log(`sample ${id}: ${sample.counts.jets} jets, ${sample.counts.primarySplittings} primary splittings`);
    }

    let request = 0;
    let lastCpuMs = 0;
    const get = async (url: string): Promise<number> => {
      const cpuBefore = cpuMs(server.pid);
      const started = performance.now();
      const response = await fetch(`${server.baseUrl}${url}`, { headers: { authorization: `Bearer ${token}` } });
      await response.arrayBuffer();
      if (response.status !== 200) throw new Error(`${url} answered ${response.status}`);
      request++;
      lastCpuMs = cpuMs(server.pid) - cpuBefore;
      return performance.now() - started;
    };
    // Ranges on edges of the cached 0.05 grid, shifted from request to request: 36 × 36 bins each time.
    const edge = (v: number) => Number(v.toFixed(2));
    const view = (k: number, filter = '') => {
      const x = edge(-0.2 - 0.05 * (k % 8));
      const y = edge(-3 - 0.05 * (k % 20));
      const bins = { x: { min: x, max: edge(x + 7.2), step: 0.2 }, y: { min: y, max: edge(y + 9), step: 0.25 } };
      return encodeURIComponent(JSON.stringify({ bins, selection: { filter } }));
    };
    const [a, b] = ids;
    const cases: Array<{ name: string; url: (k: number) => string; goal: number; repeats?: number }> = [
      { name: 'map, from the cache', url: (k) => `/api/samples/${a}/map?view=${view(k)}`, goal: GOAL_CACHE_MS },
      { name: 'contrast, from the cache', url: (k) => `/api/contrasts?samples=${a},${b}&view=${view(k)}`, goal: GOAL_CACHE_MS },
      { name: 'projection, from the cache', url: (k) => `/api/projections?samples=${a},${b}&from=${(k % 10) * 0.2}&to=4&view=${view(k)}`, goal: GOAL_CACHE_MS },
      { name: 'map, new filter', url: (k) => `/api/samples/${a}/map?view=${view(0, `pt > ${450 + k / 10} and multiplicity >= 1`)}`, goal: GOAL_FILTER_MS },
      { name: 'contrast, new filter', url: (k) => `/api/contrasts?samples=${a},${b}&view=${view(0, `pt > ${450.05 + k / 10} and m_g < 250`)}`, goal: GOAL_FILTER_MS },
      { name: 'projection, new filter', url: (k) => `/api/projections?samples=${a},${b}&view=${view(0, `abs(y) < ${1.9 - k / 1000}`)}`, goal: GOAL_FILTER_MS },
      // At most 10 repeats: each takes about a second.
      { name: 'separation, new threshold', url: (k) => `/api/separations?signal=${a}&background=${b}&minEntries=${20 + k}`, goal: GOAL_SEPARATION_MS, repeats: Math.min(repeats, 10) },
      { name: 'separation, new filter', url: (k) => `/api/separations?signal=${a}&background=${b}&view=${encodeURIComponent(JSON.stringify({ selection: { filter: `pt > ${400 + k / 10}` } }))}`, goal: GOAL_SEPARATION_MS, repeats: Math.min(repeats, 10) },
    ];
    // Warm-up, as a running server has done before anyone asks: the first use of a sample reads its jet table (for
    // the summary and the selection) and, with a selection, its splitting columns from disk into memory.
    log('first requests (columns read from disk)…');
    const firstCache = await get(`/api/samples/${a}/map`);
    await get(`/api/samples/${b}/map`);
    const firstFilter = await get(`/api/contrasts?samples=${a},${b}&view=${view(999, 'pt > 0')}`);
    const firstSeparation = await get(`/api/separations?signal=${a}&background=${b}&minEntries=1000`);
    const rows: string[] = [];
    let missed = 0;
    for (const c of cases) {
      const times: number[] = [];
      const cpu: number[] = [];
      // Two requests of the case first, with settings not used again: the engine compiles the case's code.
      const count = c.repeats ?? repeats;
      for (let k = count; k < count + 2; k++) await get(c.url(k));
      for (let k = 0; k < count; k++) {
        times.push(await get(c.url(k)));
        cpu.push(lastCpuMs);
      }
      const p50 = percentile(times, 50);
      const p95 = percentile(times, 95);
      if (p95 > c.goal) missed++;
      rows.push(
        `  ${c.name.padEnd(28)} p50 ${p50.toFixed(1).padStart(7)} ms  p95 ${p95.toFixed(1).padStart(7)} ms  (server CPU p50 ${percentile(cpu, 50).toFixed(0)} ms, p95 ${percentile(cpu, 95).toFixed(0)} ms)  goal < ${c.goal} ms (p95/goal ${(p95 / c.goal).toFixed(2)})  ${p95 <= c.goal ? 'met' : 'MISSED'}`,
      );
    }
    const memoryMb = treeKb(server.pid) / 1024;
    const peakMb = peakKb(server.pid) / 1024;
    process.stdout.write(
      [
        `maps benchmark: 2 samples of ${jets} jets, ${repeats} requests a case (separations: ${Math.min(repeats, 10)}) after 2 unmeasured ones, ${request} requests in all (load average ${loadavg()[0].toFixed(1)})`,
        `  first map after processing ${firstCache.toFixed(0)} ms; first recomputed contrast (columns read from disk) ${firstFilter.toFixed(0)} ms; first separation (record column read) ${firstSeparation.toFixed(0)} ms`,
        ...rows,
        `  server memory after the run: ${memoryMb.toFixed(0)} MB resident (peak ${peakMb.toFixed(0)} MB)`,
        missed === 0 ? '  all goals met' : `  ${missed} goal(s) MISSED`,
      ].join('\n') + '\n',
    );
  } finally {
    await server.stop();
  }
}

main().catch((error) => {
  process.stderr.write(`maps benchmark: ${error?.stack ?? error}\n`);
  process.exit(1);
});
