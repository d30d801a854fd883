// Maps, contrasts and projections through the real server: a job's cached fine grid and the stored columns give the
// same numbers, nothing is dropped (the densities over the fitted range plus the outside part add up to the sample's
// primary splittings per jet, as counted by processing), the jet selection and its filter, the full-tree planes,
// the exports, and Map and Contrast entries with their settings checked.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parse as parseYaml } from 'yaml';
import { particlesFileLines } from '@/lib/ingest/generated-sample-file';
import { demoSampleSpec } from '@/lib/demo/scenario';
import type { Client, TestServer } from '../support/server';
import { newStudy, serverWithOwner } from './fixtures';
import { uploadDone } from './sample-fixtures';

let server: TestServer;
let owner: Client;
let studyId: number;
let otherStudyId: number;
let quark: any;
let gluon: any;
let fullTree: any;
let elsewhere: any;

const file = (parton: 'quark' | 'gluon', count: number, seed: number) => `${[...particlesFileLines(demoSampleSpec(parton), count, seed)].join('\n')}\n`;
const view = (v: unknown) => encodeURIComponent(JSON.stringify(v));
const EXPLICIT = { x: { min: -0.2, max: 6, step: 0.2 }, y: { min: -2, max: 6, step: 0.2 } };

beforeAll(async () => {
  ({ server, owner: { client: owner } } = await serverWithOwner());
  studyId = await newStudy(owner, 'Maps study');
  otherStudyId = await newStudy(owner, 'Another study');
  const settings = JSON.stringify({ jet: { R: 0.8 } });
  quark = await uploadDone(owner, { studyId, name: 'quark-like jets', file: file('quark', 400, 31), fields: { settings, tags: 'quark-like' } });
  gluon = await uploadDone(owner, { studyId, name: 'gluon-like jets', file: file('gluon', 400, 32), fields: { settings, tags: 'gluon-like' } });
  fullTree = await uploadDone(owner, { studyId, name: 'full tree', file: file('gluon', 100, 33), fields: { settings: JSON.stringify({ jet: { R: 0.8 }, fullTree: true }) } });
  elsewhere = await uploadDone(owner, { studyId: otherStudyId, name: 'elsewhere', file: file('quark', 20, 34) });
}, 240_000);
afterAll(() => server?.stop());

describe('a map of one sample', () => {
  it('comes from the cached fine grid by default, with ranges fitted to the sample, and drops nothing', async () => {
    const response = await owner.get(`/api/samples/${quark.id}/map`);
    expect(response.status, response.text).toBe(200);
    const map = response.body;
    expect(map.source).toBe('cache');
    expect(map.jets).toMatchObject({ stored: 400, selected: 400, weight: 400, rejected: { pt: 0, absY: 0, leading: 0, filter: 0 } });
    expect(map.bins.x.step).toBe(0.2);
    // fitted: the range leaves out at most the 0.05 % tails of each coordinate
    expect(map.outside.perJet).toBeLessThan(0.002 * map.splittingsPerJet);
    // everything counted: ∫ρ over the bins + outside = primary splittings per jet as processing counted them
    const area = map.bins.x.step * map.bins.y.step;
    const integral = map.plane.density.reduce((sum: number, v: number) => sum + v * area, 0);
    const detail = (await owner.get(`/api/samples/${quark.id}`)).body.sample;
    expect(integral + map.outside.perJet).toBeCloseTo(detail.counts.primarySplittings / 400, 10);
    expect(map.splittingsPerJet).toBeCloseTo(detail.counts.primarySplittings / 400, 10);
    expect(map.plane.count.reduce((a: number, b: number) => a + b, 0) + map.outside.count).toBe(detail.counts.primarySplittings);
    expect(map.summary.multiplicity.mean).toBeGreaterThan(0);
    expect(map.summary.distributions.map((d: { name: string }) => d.name)).toEqual(['m_g', 'z_g', 'R_g', 'multiplicity']);
    // grooming mode: every jet is in the groomed distributions
    for (const d of map.summary.distributions) expect(d.missingWeight).toBe(0);
  });

  it('gives the same numbers from the stored columns when the selection is not the default', async () => {
    const cached = (await owner.get(`/api/samples/${quark.id}/map?view=${view({ bins: EXPLICIT })}`)).body;
    const recomputed = (await owner.get(`/api/samples/${quark.id}/map?view=${view({ bins: EXPLICIT, selection: { filter: 'pt > 0' } })}`)).body;
    expect(cached.source).toBe('cache');
    expect(recomputed.source).toBe('columns');
    expect(recomputed.plane.count).toEqual(cached.plane.count);
    recomputed.plane.density.forEach((v: number, i: number) => expect(v).toBeCloseTo(cached.plane.density[i], 12));
    expect(recomputed.outside.perJet).toBeCloseTo(cached.outside.perJet, 12);
  });

  it('selects jets by pt, |y|, leading N and the filter, counting each jet under the first cut it fails', async () => {
    const jets = (await owner.get(`/api/samples/${quark.id}/jets?limit=200`)).body.jets.concat(
      (await owner.get(`/api/samples/${quark.id}/jets?limit=200&offset=200`)).body.jets,
    );
    const median = jets.map((j: any) => j.mult).sort((a: number, b: number) => a - b)[200];
    const selection = { ptMin: 300, absYMax: 1.5, leading: 1, filter: `multiplicity >= ${median}` };
    const response = await owner.get(`/api/samples/${quark.id}/map?view=${view({ selection })}`);
    expect(response.status, response.text).toBe(200);
    const { rejected, selected, stored } = response.body.jets;
    expect(stored).toBe(400);
    expect(selected + rejected.pt + rejected.absY + rejected.leading + rejected.filter).toBe(400);
    expect(rejected.absY).toBeGreaterThan(0); // |y| is uniform in [0, 2]
    expect(rejected.filter).toBeGreaterThan(0);
    expect(rejected.leading).toBe(0); // one jet a record
    const kept = jets.filter((j: any) => j.pt >= 300 && Math.abs(j.y) < 1.5 && j.mult >= median);
    expect(selected).toBe(kept.length);
  });

  it('refuses a wrong filter, naming the field and the unknown names', async () => {
    const response = await owner.get(`/api/samples/${quark.id}/map?view=${view({ selection: { filter: 'ptt > 3 and mass < 2' } })}`);
    expect(response.status).toBe(400);
    expect(response.body.error.details).toEqual([{ path: 'view.selection.filter', message: expect.stringMatching(/unknown names ptt, mass/) }]);
    const assignment = await owner.get(`/api/samples/${quark.id}/map?view=${view({ selection: { filter: 'pt = 3' } })}`);
    expect(assignment.body.error.message).toMatch(/assignments are not allowed/);
  });

  it('refuses bad views with the path of the problem', async () => {
    const bad = await owner.get(`/api/samples/${quark.id}/map?view=${view({ x: { variable: 'theta' } })}`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('view.x.variable');
    const notJson = await owner.get(`/api/samples/${quark.id}/map?view=%7Bnope`);
    expect(notJson.body.error.details[0]).toEqual({ path: 'view', message: 'view must be a JSON object (view-settings)' });
    const tooFine = await owner.get(`/api/samples/${quark.id}/map?view=${view({ bins: { x: { min: 0, max: 10, step: 0.001 } } })}`);
    expect(tooFine.status).toBe(400);
    expect(tooFine.body.error.details[0].path).toBe('bins.x');
    const nobody = await owner.get(`/api/samples/${quark.id}/map?view=${view({ selection: { ptMin: 1e6 } })}`);
    expect(nobody.status).toBe(409);
    expect(nobody.body.error.code).toBe('no_jets');
  });

  it('draws secondary and all splittings only for samples with the full tree', async () => {
    const refused = await owner.get(`/api/samples/${quark.id}/map?view=${view({ tree: 'secondary' })}`);
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('full_tree_not_stored');
    expect(refused.body.error.message).toMatch(/needs the full C\/A tree/);
    const all = (await owner.get(`/api/samples/${fullTree.id}/map?view=${view({ tree: 'all' })}`)).body;
    const primary = (await owner.get(`/api/samples/${fullTree.id}/map?view=${view({ tree: 'primary', selection: { filter: 'pt > 0' } })}`)).body;
    const secondary = (await owner.get(`/api/samples/${fullTree.id}/map?view=${view({ tree: 'secondary' })}`)).body;
    const fromSecond = (await owner.get(`/api/samples/${fullTree.id}/map?view=${view({ tree: 'fromSecond' })}`)).body;
    const detail = (await owner.get(`/api/samples/${fullTree.id}`)).body.sample;
    expect(all.splittingsPerJet).toBeCloseTo(detail.counts.allSplittings / 100, 10);
    expect(primary.splittingsPerJet + fromSecond.splittingsPerJet).toBeCloseTo(all.splittingsPerJet, 10);
    expect(secondary.splittingsPerJet).toBeLessThanOrEqual(fromSecond.splittingsPerJet);
    expect(secondary.splittingsPerJet).toBeGreaterThan(0);
  });

  it('draws the other coordinates: ln(1/z), ln κ and the (Δ, z) plane with a linear Δ', async () => {
    for (const v of [{ y: { variable: 'lnInvZ' } }, { y: { variable: 'lnKappa' } }, { x: { variable: 'delta' }, y: { variable: 'z', log: true } }]) {
      const map = (await owner.get(`/api/samples/${quark.id}/map?view=${view(v)}`)).body;
      expect(map.source).toBe('columns');
      const area = map.bins.x.step * map.bins.y.step;
      const integral = map.plane.density.reduce((sum: number, x: number) => sum + x * area, 0);
      expect(integral + map.outside.perJet).toBeCloseTo(map.splittingsPerJet, 10);
    }
  });
});

describe('contrasts and projections', () => {
  it('compares two samples on shared bins: ratio, χ²/ndf, masking', async () => {
    const response = await owner.get(`/api/contrasts?samples=${quark.id},${gluon.id}&minEntries=5&view=${view({ bins: EXPLICIT })}`);
    expect(response.status, response.text).toBe(200);
    const c = response.body;
    expect(c.inputs.map((i: any) => i.sample.id)).toEqual([quark.id, gluon.id]);
    expect(c.inputs[0].plane.xEdges).toEqual(c.inputs[1].plane.xEdges);
    const [comparison] = c.comparisons;
    expect(comparison.ndf).toBe(comparison.masked.filter((m: number) => m === 0).length);
    let chi2 = 0;
    comparison.masked.forEach((masked: number, i: number) => {
      const [a, b] = c.inputs.map((input: any) => input.plane);
      const variance = a.error[i] ** 2 + b.error[i] ** 2;
      if (!masked && variance > 0) chi2 += (b.density[i] - a.density[i]) ** 2 / variance;
    });
    expect(comparison.chi2).toBeCloseTo(chi2, 8);
    comparison.value.forEach((v: number | null, i: number) => {
      if (comparison.masked[i]) expect(v).toBeNull();
      else expect(v).toBeCloseTo(c.inputs[1].plane.density[i] / c.inputs[0].plane.density[i], 10);
    });
    const pull = (await owner.get(`/api/contrasts?samples=${quark.id},${gluon.id}&mode=pull&view=${view({ bins: EXPLICIT })}`)).body;
    expect(pull.comparisons[0].mode).toBe('pull');
  });

  it('projects several samples onto one axis with their ratio', async () => {
    const response = await owner.get(`/api/projections?samples=${quark.id},${gluon.id}&onto=y&from=1&to=2&view=${view({ bins: EXPLICIT })}`);
    expect(response.status, response.text).toBe(200);
    const p = response.body;
    expect(p.slice).toEqual({ from: 1, to: 2 });
    expect(p.series).toHaveLength(2);
    expect(p.ratios[0].sample).toBe(gluon.id);
    expect(p.edges.length).toBe(p.series[0].density.length + 1);
  });

  it('refuses samples the caller may not see, and malformed lists', async () => {
    const stranger = await owner.get(`/api/contrasts?samples=${quark.id},999999`);
    expect(stranger.status).toBe(404);
    const twice = await owner.get(`/api/contrasts?samples=${quark.id},${quark.id}`);
    expect(twice.status).toBe(400);
    expect(twice.body.error.details[0].path).toBe('samples');
  });
});

describe('exports', () => {
  it('CSV and JSON of the binned values with errors, one row a bin', async () => {
    const csv = await owner.get(`/api/samples/${quark.id}/map?format=csv&view=${view({ bins: EXPLICIT })}`);
    expect(csv.status).toBe(200);
    expect(csv.headers.get('content-disposition')).toMatch(/attachment; filename="map-sample-\d+\.csv"/);
    const lines = csv.text.trim().split('\n');
    expect(lines[0]).toBe('ln(1/Delta) low,ln(1/Delta) high,ln(kt/GeV) low,ln(kt/GeV) high,rho,rho error,splittings (raw count)');
    expect(lines.length).toBe(1 + 31 * 40);
    const json = JSON.parse((await owner.get(`/api/samples/${quark.id}/map?format=json&view=${view({ bins: EXPLICIT })}`)).text);
    expect(json.dependent[0].values).toHaveLength(31 * 40);
  });

  it('a YAML table in the layout of the open record of published measurements', async () => {
    const text = (await owner.get(`/api/contrasts?samples=${quark.id},${gluon.id}&format=yaml&view=${view({ bins: EXPLICIT })}`)).text;
    const table = parseYaml(text);
    expect(table.independent_variables.map((v: any) => v.header.name)).toEqual(['ln(1/Delta)', 'ln(kt/GeV)']);
    expect(table.independent_variables[0].values[0]).toEqual({ low: -0.2, high: 0 });
    const ratio = table.dependent_variables.find((d: any) => d.header.name === 'rho B / rho A');
    expect(ratio.qualifiers).toEqual(expect.arrayContaining([expect.objectContaining({ name: 'chi2/ndf' })]));
    expect(ratio.values.some((v: any) => v.errors?.[0]?.label === 'stat' && typeof v.errors[0].symerror === 'number')).toBe(true);
    expect(ratio.values.some((v: any) => v.value === '-')).toBe(true); // masked bins
  });

  it('a provenance file naming the samples’ hashes, settings and the software', async () => {
    const p = JSON.parse((await owner.get(`/api/projections?samples=${quark.id}&format=provenance`)).text);
    expect(p.kind).toBe('projection');
    expect(p.software.name).toBe('splitfield');
    expect(p.samples[0].file.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(p.samples[0].settings.jet.R).toBe(0.8);
    expect(p.view.tree).toBe('primary');
  });
});

describe('Map and Contrast entries', () => {
  it('are created with checked settings, of the study’s own samples only', async () => {
    const made = await owner.post(`/api/studies/${studyId}/entries`, { kind: 'map', title: 'Quark map', settings: { sampleId: quark.id } });
    expect(made.status, made.text).toBe(201);
    expect(made.body.entry.settings.view.tree).toBe('primary');
    expect(made.body.entry.settings.display.colour).toBe('linear');
    const contrast = await owner.post(`/api/studies/${studyId}/entries`, { kind: 'contrast', settings: { sampleIds: [quark.id, gluon.id], mode: 'pull' } });
    expect(contrast.status, contrast.text).toBe(201);
    const foreign = await owner.post(`/api/studies/${studyId}/entries`, { kind: 'map', settings: { sampleId: elsewhere.id } });
    expect(foreign.status).toBe(400);
    expect(foreign.body.error.details[0].path).toBe('settings.sampleId');
    const badKind = await owner.post(`/api/studies/${studyId}/entries`, { kind: 'separation', settings: {} });
    expect(badKind.status).toBe(400);
    const oneSample = await owner.post(`/api/studies/${studyId}/entries`, { kind: 'contrast', settings: { sampleIds: [quark.id] } });
    expect(oneSample.body.error.details[0].path).toBe('settings.sampleIds');
  });

  it('change their settings by PATCH, checked against their kind', async () => {
    const made = await owner.post(`/api/studies/${studyId}/entries`, { kind: 'map', settings: { sampleId: quark.id } });
    const url = `/api/studies/${studyId}/entries/${made.body.entry.id}`;
    const changed = await owner.patch(url, { settings: { sampleId: gluon.id, display: { colour: 'log' } } });
    expect(changed.status, changed.text).toBe(200);
    expect(changed.body.entry.settings).toMatchObject({ sampleId: gluon.id, display: { colour: 'log' } });
    const bad = await owner.patch(url, { settings: { sampleId: gluon.id, view: { bins: { x: { step: -1 } } } } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('settings.view.bins.x.step');
    const note = await owner.post(`/api/studies/${studyId}/entries`, { kind: 'note', body: 'text' });
    const onNote = await owner.patch(`/api/studies/${studyId}/entries/${note.body.entry.id}`, { settings: { sampleId: quark.id } });
    expect(onNote.status).toBe(400);
    expect(onNote.body.error.message).toMatch(/a note has no settings/);
  });
});
