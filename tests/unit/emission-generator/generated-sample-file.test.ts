// A generated sample written as a splitfield-particles file (DESIGN.md "Upload format") and read back by the
// project's own reader: header, scenario metadata, and every particle at full double precision.
import { mkdtemp, readdir, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { demoSampleSpec } from '@/lib/demo/scenario';
import { writeGeneratedSampleFile, type GeneratedSampleSpec } from '@/lib/ingest/generated-sample-file';
import { openParticleFile } from '@/lib/ingest/reader';
import { generateEmissionRecords } from '@/lib/physics/emission-generator';

let root: string;
beforeEach(async () => {
  root = await mkdtemp(path.join(tmpdir(), 'splitfield-generated-'));
});
afterEach(async () => {
  await rm(root, { recursive: true, force: true });
});

describe('generated sample files', () => {
  it('hold the demo quark-like sample in the upload format, readable by the ingest reader', async () => {
    const spec = demoSampleSpec('quark');
    const file = path.join(root, 'quark.jsonl');
    await writeGeneratedSampleFile(file, spec, 25, 9);
    expect(await readdir(root)).toEqual(['quark.jsonl']);

    const reader = await openParticleFile(file);
    try {
      expect(reader.header.format).toBe('splitfield-particles');
      expect(reader.header.content).toBe('jets');
      expect(reader.header.sample.name).toBe(spec.name);
      expect(reader.header.sample.tags).toEqual(['demo', 'generated', 'quark-like']);
      expect(reader.header.metadata.scenario).toEqual(spec.scenario);
      expect(reader.header.metadata.generator).toEqual({ name: 'splitfield emission generator', seed: 9, jets: 25, settings: spec.settings });
      const expected = [...generateEmissionRecords(spec.settings, 25, 9, 'q-demo-')];
      const read = [];
      for await (const record of reader.records()) read.push(record);
      expect(read.map((r) => r.id)).toEqual(expected.map((r) => r.id));
      expect(read.map((r) => Array.from(r.particles))).toEqual(expected.map((r) => Array.from(r.particles)));
    } finally {
      reader.close();
    }
  });

  it('describe the gluon-like demo sample as such', () => {
    const spec = demoSampleSpec('gluon');
    expect(spec.settings.parton).toBe('gluon');
    expect(spec.label).toBe('g-demo');
    expect(spec.description).toMatch(/^gluon-like jets/);
  });

  it('never replace an existing file and leave nothing behind on failure', async () => {
    const file = path.join(root, 'taken.jsonl');
    await writeFile(file, 'earlier content');
    await expect(writeGeneratedSampleFile(file, demoSampleSpec('gluon'), 3, 1)).rejects.toThrow(/EEXIST/);
    const broken: GeneratedSampleSpec = { ...demoSampleSpec('quark'), settings: { ...demoSampleSpec('quark').settings, ktCut: 0.2 } };
    await expect(writeGeneratedSampleFile(path.join(root, 'broken.jsonl'), broken, 3, 1)).rejects.toThrow(/ktCut must be at least 1 GeV/);
    expect(await readdir(root)).toEqual(['taken.jsonl']);
  });
});
