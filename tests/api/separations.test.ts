// Separations and taggers through the real server: the separation of two demo-like samples (quark-like signal,
// gluon-like background), its train/evaluate split checked on the stored rows, bad inputs of the route and of the
// entry settings, region proposals saved with the entry in plane coordinates, and a tagger saved from the entry,
// exported, imported and applied to a third sample: the server's per-jet scores equal those of the README's
// ten-line recipe on the exported declusterings, for the saved and the imported tagger alike.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoSampleSpec } from '@/lib/demo/scenario';
import { ColumnReader } from '@/lib/ingest/columns';
import { particlesFileLines } from '@/lib/ingest/generated-sample-file';
import { hanleyMcNeilError } from '@/lib/physics/separation/roc';
import { splitJets, trainsOn } from '@/lib/physics/separation/split';
import { sampleDir, sampleStorage } from '@/lib/samples/storage';
import type { Client, TestServer } from '../support/server';
import { newStudy, serverWithOwner } from './fixtures';
import { uploadDone } from './sample-fixtures';

let server: TestServer;
let owner: Client;
let studyId: number;
let quark: any;
let gluon: any;
let third: any;

const file = (parton: 'quark' | 'gluon', count: number, seed: number) => `${[...particlesFileLines(demoSampleSpec(parton), count, seed)].join('\n')}\n`;
const view = (v: unknown) => encodeURIComponent(JSON.stringify(v));
const separation = (query: string) => owner.get(`/api/separations?${query}`);
/** Bins of 0.5 × 0.5: a thousand jets a sample fill them well enough for a table. */
const COARSE = { bins: { x: { step: 0.5 }, y: { step: 0.5 } } };

beforeAll(async () => {
  ({ server, owner: { client: owner } } = await serverWithOwner());
  studyId = await newStudy(owner, 'Separation study');
  const otherStudyId = await newStudy(owner, 'Another study');
  const settings = JSON.stringify({ jet: { R: 0.8 } });
  quark = await uploadDone(owner, { studyId, name: 'quark-like jets', file: file('quark', 1000, 41), fields: { settings } });
  gluon = await uploadDone(owner, { studyId, name: 'gluon-like jets', file: file('gluon', 1000, 42), fields: { settings } });
  third = await uploadDone(owner, { studyId: otherStudyId, name: 'third sample', file: file('gluon', 150, 43), fields: { settings } });
}, 240_000);
afterAll(() => server?.stop());

describe('the separation route', () => {
  let result: any;
  beforeAll(async () => {
    const response = await separation(`signal=${quark.id}&background=${gluon.id}&minEntries=5&view=${view(COARSE)}`);
    expect(response.status, response.text).toBe(200);
    result = response.body;
  });

  it('splits each sample by record position, on the stored rows: no jet in both halves', async () => {
    for (const [sample, side] of [[quark, result.signal], [gluon, result.background]] as const) {
      const reader = await ColumnReader.open(sampleDir(sampleStorage(server.storageDir), sample.id));
      const record = await reader.jetColumn('record');
      const split = splitJets(record, new Uint8Array(record.length).fill(1));
      for (let j = 0; j < record.length; j++) {
        expect(split.train[j] + split.evaluate[j]).toBe(1);
        expect(split.train[j]).toBe(trainsOn(record[j]) ? 1 : 0);
      }
      expect(side.trainJets).toBe(split.trainCount);
      expect(side.evaluateJets).toBe(split.evaluateCount);
      expect(side.trainJets + side.evaluateJets).toBe(1000);
    }
    expect(result.splitRule).toMatch(/even positions/);
  });

  it('gives the ln-ratio table, the score’s ROC with Hanley–McNeil errors, working points and the single-variable taggers', () => {
    const { x, y } = result.bins;
    expect(result.logRatio.value).toHaveLength(x.count * y.count);
    result.logRatio.value.forEach((v: number | null, i: number) => expect(v === null).toBe(result.logRatio.masked[i] === 1));
    const { roc } = result.score;
    expect(roc.auc).toBeGreaterThan(0.6);
    expect(roc.aucError).toBeCloseTo(hanleyMcNeilError(roc.auc, result.signal.evaluateJets, result.background.evaluateJets), 12);
    expect(roc.workingPoints.map((w: any) => w.signalEfficiency)).toEqual([0.3, 0.5, 0.7]);
    for (const w of roc.workingPoints) {
      expect(w.rejection).toBeGreaterThan(1);
      expect(w.rejectionError).toBeGreaterThan(0);
    }
    expect(result.variables.map((v: any) => v.name)).toEqual(['multiplicity', 'mg', 'zg', 'Rg', 'm', 'n']);
    // Quark-like jets radiate less (C_F < C_A): fewer primary emissions is the signal-like side.
    expect(result.variables[0].largerIsSignal).toBe(false);
    expect(result.variables[0].roc.auc).toBeGreaterThan(0.55);
    const d = result.score.distribution;
    d.fractions.forEach((f: number[], k: number) => expect(f.reduce((a, b) => a + b, 0) + d.below[k] + d.above[k]).toBeCloseTo(1, 10));
    expect(result.regions.measure).toMatch(/symmetric χ²/);
    expect(result.regions.proposals.length).toBeGreaterThan(0);
    expect(result.regions.proposals[0]).toMatchObject({ rank: 1, rectangle: { x1: expect.any(Number), x2: expect.any(Number) } });
  });

  it('refuses bad inputs with the field named', async () => {
    const bad = async (query: string, status: number, path?: string) => {
      const response = await separation(query);
      expect(response.status, response.text).toBe(status);
      if (path) expect(response.body.error.details.map((d: any) => d.path)).toContain(path);
    };
    await bad(`signal=${quark.id}&background=${quark.id}`, 400, 'background');
    await bad(`background=${quark.id}`, 400, 'signal');
    await bad(`signal=${quark.id}&background=${gluon.id}&view=nope`, 400, 'view');
    await bad(`signal=${quark.id}&background=${gluon.id}&minEntries=many`, 400, 'minEntries');
    await bad(`signal=${quark.id}&background=${gluon.id}&view=${view({ selection: { filter: 'pt >' } })}`, 400, 'view.selection.filter');
    await bad(`signal=${quark.id}&background=${gluon.id}&view=${view({ selection: { ptMin: 1e6 } })}`, 409);
    await bad(`signal=${quark.id}&background=999999`, 404);
  });
});

describe('Separation entries, saved regions and taggers', () => {
  let entryId: number;
  const geometry = { axes: { x: 'lnInvDelta', y: 'lnKt' }, shape: { type: 'rectangle', x1: 1, x2: 2.4, y1: 0.2, y2: 1.6 } };

  it('creates a Separation entry with defaults, and refuses settings that are wrong', async () => {
    const made = await owner.post(`/api/studies/${studyId}/entries`, { kind: 'separation', title: 'Quark against gluon', settings: { signalSampleId: quark.id, backgroundSampleId: gluon.id, view: COARSE } });
    expect(made.status, made.text).toBe(201);
    entryId = made.body.entry.id;
    expect(made.body.entry.settings).toMatchObject({ minEntries: 10, display: { rocAxis: 'log' }, savedRegions: [], view: { tree: 'primary', selection: { filter: '' } } });
    const refused = async (settings: unknown, path: string) => {
      const response = await owner.post(`/api/studies/${studyId}/entries`, { kind: 'separation', settings });
      expect(response.status, response.text).toBe(400);
      expect(response.body.error.details.map((d: any) => d.path)).toContain(path);
    };
    await refused({ signalSampleId: quark.id, backgroundSampleId: quark.id }, 'settings.backgroundSampleId');
    await refused({ signalSampleId: quark.id, backgroundSampleId: third.id }, 'settings');
    await refused({ signalSampleId: quark.id }, 'settings.backgroundSampleId');
    await refused({ signalSampleId: quark.id, backgroundSampleId: gluon.id, minEntries: -1 }, 'settings.minEntries');
  });

  it('keeps a region proposal in plane coordinates, and refuses a rectangle without width', async () => {
    const saved = await owner.patch(`/api/studies/${studyId}/entries/${entryId}`, {
      settings: { signalSampleId: quark.id, backgroundSampleId: gluon.id, view: COARSE, savedRegions: [{ title: 'Proposal 1', rank: 1, geometry }] },
    });
    expect(saved.status, saved.text).toBe(200);
    expect(saved.body.entry.settings.savedRegions).toEqual([{ title: 'Proposal 1', rank: 1, geometry }]);
    const bad = await owner.patch(`/api/studies/${studyId}/entries/${entryId}`, {
      settings: { signalSampleId: quark.id, backgroundSampleId: gluon.id, savedRegions: [{ title: 'x', geometry: { ...geometry, shape: { ...geometry.shape, x2: geometry.shape.x1 } } }] },
    });
    expect(bad.status, bad.text).toBe(400);
    expect(bad.body.error.details.map((d: any) => d.path)).toContain('settings.savedRegions.0.geometry.shape.x2');
  });

  it('saves the entry as a tagger, exports it, imports it, and both score a third sample as the README recipe does', async () => {
    const made = await owner.post(`/api/studies/${studyId}/taggers`, { entryId, name: 'Quark tagger' });
    expect(made.status, made.text).toBe(201);
    const tagger = made.body.tagger;
    const shown = (await separation(`signal=${quark.id}&background=${gluon.id}&minEntries=10&view=${view(COARSE)}`)).body;
    expect(tagger.training.signal.fileHash).toBe(shown.signal.sample.fileHash);
    expect(tagger.training.background.fileHash).toBe(shown.background.sample.fileHash);
    expect(tagger.training.signal.fileHash).not.toBe(tagger.training.background.fileHash);

    const exported = await owner.get(`/api/studies/${studyId}/taggers/${tagger.id}?download=1`);
    expect(exported.status).toBe(200);
    expect(exported.headers.get('content-disposition')).toMatch(/attachment; filename="tagger-\d+\.splitfield-tagger\.json"/);
    const document = JSON.parse(exported.text);
    expect(document).toMatchObject({ format: 'splitfield-tagger', version: 1, plane: { tree: 'primary', x: { variable: 'lnInvDelta' }, y: { variable: 'lnKt' } } });
    // The table is the entry's separation's.
    expect(document.lnRatio.flat()).toEqual(shown.logRatio.value);
    expect(document.offset).toBe(-shown.logRatio.excessPerJet);

    const imported = await owner.post(`/api/studies/${studyId}/taggers`, { document });
    expect(imported.status, imported.text).toBe(201);
    const scores = async (id: number) => {
      const response = await owner.get(`/api/studies/${studyId}/taggers/${id}/scores?sample=${third.id}&format=jets`);
      expect(response.status, response.text).toBe(200);
      return response.text.trim().split('\n').map((line) => JSON.parse(line));
    };
    const fromSaved = await scores(tagger.id);
    const fromImported = await scores(imported.body.tagger.id);
    expect(fromImported).toEqual(fromSaved);
    expect(fromSaved).toHaveLength(150);

    // README "Separations and taggers": the ten-line recipe on one exported jet.
    const recipe = (t: any, jet: any) => {
      const { x, y } = t.bins;
      let score = t.offset;
      for (const [lnInvDelta, lnKt] of jet.primary) {
        const ix = Math.floor((lnInvDelta - x.min) / x.step);
        const iy = Math.floor((lnKt - y.min) / y.step);
        const term = ix >= 0 && ix < x.count && iy >= 0 && iy < y.count ? t.lnRatio[iy][ix] : null;
        if (term !== null) score += term;
      }
      return score;
    };
    const lines = (await owner.get(`/api/samples/${third.id}/export`)).text.trim().split('\n').slice(1).map((line) => JSON.parse(line));
    expect(lines).toHaveLength(150);
    lines.forEach((jet, k) => {
      expect(fromSaved[k]).toMatchObject({ rec: jet.rec, jet: jet.jet });
      expect(fromSaved[k].score).toBeCloseTo(recipe(document, jet), 12);
    });

    const applied = await owner.get(`/api/studies/${studyId}/taggers/${tagger.id}/scores?sample=${third.id}`);
    expect(applied.status, applied.text).toBe(200);
    expect(applied.body.workingPoints.map((w: any) => w.signalEfficiency)).toEqual([0.3, 0.5, 0.7]);
    const passing = fromSaved.filter((s: any) => s.score >= document.workingPoints[1].threshold).length / 150;
    expect(applied.body.workingPoints[1].efficiency).toBeCloseTo(passing, 12);
  });

  it('refuses a tagger from a note or a broken file, and deletes one', async () => {
    const note = await owner.post(`/api/studies/${studyId}/entries`, { kind: 'note', body: 'a note' });
    const fromNote = await owner.post(`/api/studies/${studyId}/taggers`, { entryId: note.body.entry.id, name: 'x' });
    expect(fromNote.status, fromNote.text).toBe(400);
    expect(fromNote.body.error.details.map((d: any) => d.path)).toContain('entryId');
    const list = (await owner.get(`/api/studies/${studyId}/taggers`)).body.taggers;
    const { document } = (await owner.get(`/api/studies/${studyId}/taggers/${list[0].id}`)).body;
    const broken = await owner.post(`/api/studies/${studyId}/taggers`, { document: { ...document, lnRatio: document.lnRatio.slice(1) } });
    expect(broken.status, broken.text).toBe(400);
    expect(broken.body.error.details.map((d: any) => d.path)).toContain('document.lnRatio');
    const wrongFormat = await owner.post(`/api/studies/${studyId}/taggers`, { document: { ...document, format: 'other' } });
    expect(wrongFormat.status).toBe(400);
    expect((await owner.get(`/api/studies/${studyId}/taggers`)).body.taggers).toHaveLength(list.length);
    expect((await owner.send('DELETE', `/api/studies/${studyId}/taggers/${list[0].id}`)).status).toBe(204);
    expect((await owner.get(`/api/studies/${studyId}/taggers/${list[0].id}`)).status).toBe(404);
  });
});
