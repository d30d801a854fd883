// The pure rules of the samples layer: upload fields, processing settings, file names, progress, configuration.
import { describe, expect, it } from 'vitest';
import { progressView } from '@/lib/jobs/progress';
import { readSampleConfig } from '@/lib/samples/config';
import { fileNameProblem } from '@/lib/samples/file-name';
import { defaultSettings, RESULTS_GENERATION, settingsInputSchema, settingsKey } from '@/lib/ingest/settings';
import { uploadFieldsSchema } from '@/lib/samples/upload-fields';

describe('processing settings', () => {
  it('default to PHYSICS.md and common practice', () => {
    expect(defaultSettings()).toEqual({
      jet: { algorithm: 'antikt', R: 0.4, ptMin: 20, yMax: 2.5, maxJets: null, exclusive: null },
      softDrop: { zCut: 0.1, beta: 0, R0: 0.4, mode: 'grooming' },
      multiplicityKtCut: 1,
      fullTree: false,
      collision: 'hadron',
      ee: { algorithm: 'durham', p: -1, eMin: 0 },
      particles: { dropNeutrinos: false, pidExclude: [], pidInclude: [], chargedOnly: false, ptMin: 0, rapidityMax: null, rapidityKind: 'y' },
      flavourTags: false,
    });
  });

  it('key stored results by every setting and the engine generation, so an older engine\'s samples never match', () => {
    // A sample stored by the first engine (SoftDrop tagging-like nulls, the narrower fine grid) had this key.
    expect(settingsKey(defaultSettings())).not.toBe('["antikt",0.4,20,2.5,null,0.1,0,0.4,1,false]');
    expect(JSON.parse(settingsKey(defaultSettings()))[0]).toBe(RESULTS_GENERATION);
    // Settings stored before a setting existed read as its default and give the default's key.
    const old = { jet: { algorithm: 'antikt' as const, R: 0.4, ptMin: 20, yMax: 2.5, maxJets: null }, softDrop: { zCut: 0.1, beta: 0, R0: 0.4 }, multiplicityKtCut: 1, fullTree: false };
    expect(settingsKey(old)).toBe(settingsKey(defaultSettings()));
    const changes = [
      { collision: 'ee', jet: { exclusive: { n: 2 } } },
      { particles: { chargedOnly: true } },
      { flavourTags: true },
      { jet: { algorithm: 'kt', exclusive: { n: 2 } } },
      { softDrop: { mode: 'tagging' } },
    ];
    const keys = changes.map((change) => settingsKey(settingsInputSchema.parse(change)));
    expect(new Set([...keys, settingsKey(old)]).size).toBe(changes.length + 1);
  });

  it('take SoftDrop in tagging mode when asked, and name a wrong mode', () => {
    expect(settingsInputSchema.parse({ softDrop: { mode: 'tagging' } }).softDrop.mode).toBe('tagging');
    const wrong = settingsInputSchema.safeParse({ softDrop: { mode: 'pruning' } });
    expect(wrong.success).toBe(false);
    expect(wrong.error!.issues[0].message).toBe('softDrop.mode must be "grooming" or "tagging"');
  });

  it('complete a partial object, R0 following R unless given', () => {
    expect(settingsInputSchema.parse({ jet: { R: 1.0 } }).softDrop.R0).toBe(1.0);
    expect(settingsInputSchema.parse({ jet: { R: 1.0 }, softDrop: { R0: 0.8 } }).softDrop.R0).toBe(0.8);
  });

  it.each([
    [{ jet: { R: 0 } }, 'jet.R must be in (0, 10]'],
    [{ jet: { algorithm: 'siscone' } }, 'jet.algorithm must be "antikt", "kt" or "ca"'],
    [{ jet: { maxJets: 1.5 } }, 'jet.maxJets must be a whole number'],
    [{ softDrop: { zCut: 1 } }, 'softDrop.zCut must be in [0, 1)'],
    [{ multiplicityKtCut: -1 }, 'multiplicityKtCut must be >= 0 (GeV)'],
    [{ fullTree: 'yes' }, 'fullTree must be true or false'],
    [{ jet: { exclusive: { n: 2 } } }, 'exclusive jets need jet.algorithm "kt" or "ca"'],
    [{ jet: { algorithm: 'kt', exclusive: { ycut: 0.1 } } }, 'jet.exclusive.ycut is for e+e- events (collision "ee"); use dcut or n'],
    [{ jet: { algorithm: 'ca', exclusive: { n: 2 } }, flavourTags: true }, 'flavour tags with exclusive jets need jet.algorithm "kt" (a C/A ghost far from every particle would be a jet of its own)'],
    [{ collision: 'ee' }, 'Durham jets need jet.exclusive {"n": N} or {"ycut": Y}'],
    [{ collision: 'ee', ee: { algorithm: 'cambridge' }, jet: { exclusive: { n: 2 } } }, 'e+e- Cambridge jets need jet.exclusive {"ycut": Y}'],
    [{ collision: 'ee', ee: { algorithm: 'genkt' }, jet: { exclusive: { n: 2 } } }, 'the generalised e+e- kt algorithm gives inclusive jets: leave jet.exclusive null'],
    [{ collision: 'lep' }, 'collision must be "hadron" or "ee"'],
    [{ particles: { rapidityMax: 0 } }, 'particles.rapidityMax must be > 0'],
    [{ particles: { pidInclude: [211, 1.5] } }, 'particles.pidInclude must list whole numbers'],
    [{ particles: { pidInclude: [211], pidExclude: [-211] } }, 'particles.pidExclude and particles.pidInclude name the same code'],
    [{ particles: { colour: true } }, 'Unrecognized key: "colour"'],
  ])('refuse %j: %s', (input, message) => {
    const parsed = settingsInputSchema.safeParse(input);
    expect(parsed.success).toBe(false);
    expect(parsed.error!.issues.map((issue) => issue.message)).toContain(message);
  });

  it('have equal keys exactly when they are equal', () => {
    expect(settingsKey(settingsInputSchema.parse({ softDrop: { R0: 0.4 } }))).toBe(settingsKey(defaultSettings()));
    expect(settingsKey(settingsInputSchema.parse({ jet: { ptMin: 21 } }))).not.toBe(settingsKey(defaultSettings()));
  });
});

describe('upload fields', () => {
  const base = { studyId: '3', name: 'Run' };

  it('read tags written with commas or as a JSON array, without repeats', () => {
    expect(uploadFieldsSchema.parse({ ...base, tags: ' a, b ,, a' }).tags).toEqual(['a', 'b']);
    expect(uploadFieldsSchema.parse({ ...base, tags: '["x, y", "z"]' }).tags).toEqual(['x, y', 'z']);
    expect(uploadFieldsSchema.parse({ ...base, tags: '' }).tags).toEqual([]);
  });

  it('read force as 1/0/true/false and the settings as JSON', () => {
    const parsed = uploadFieldsSchema.parse({ ...base, force: 'true', settings: '{"fullTree":true}' });
    expect(parsed).toMatchObject({ studyId: 3, force: true, settings: { fullTree: true } });
    expect(uploadFieldsSchema.safeParse({ ...base, force: 'yes' }).success).toBe(false);
    expect(uploadFieldsSchema.safeParse({ ...base, settings: '[1' }).error?.issues[0].message).toBe('settings must be JSON');
  });
});

describe('uploaded file names', () => {
  it.each(['run 7.jsonl.gz', 'ümlaut-jets.hepmc', '.hidden', 'a.b.c'])('accept %s', (name) => {
    expect(fileNameProblem(name)).toBeNull();
  });
  it.each([['a/b'], ['a\\b'], ['..'], ['x..y'], ['tab\there'], [''], ['x'.repeat(256)]])('refuse %j', (name) => {
    expect(fileNameProblem(name)).toEqual(expect.any(String));
  });
});

describe('job progress', () => {
  const progress = {
    records: 50,
    particles: 0,
    jets: 100,
    primarySplittings: 900,
    allSplittings: 4000,
    skipped: 0,
    rejected: { pt: 0, y: 0, rank: 0 },
    particlesRemoved: null,
    flavours: null,
  };

  it('gives the fraction read, rates and the time left', () => {
    const view = progressView({ ...progress, bytesRead: 250, bytesTotal: 1000, elapsedMs: 2000, done: false }, 1000, false);
    expect(view).toEqual({
      fraction: 0.25,
      bytesRead: 250,
      bytesTotal: 1000,
      records: 50,
      jets: 100,
      splittings: 900,
      jetsPerSecond: 50,
      recordsPerSecond: 25,
      elapsedSeconds: 2,
      secondsLeft: 6,
    });
  });

  it('counts every splitting for a full tree, and has no estimate before 1% is read', () => {
    const view = progressView({ ...progress, bytesRead: 5, bytesTotal: null, elapsedMs: 10, done: false }, 1000, true);
    expect(view).toMatchObject({ bytesTotal: 1000, splittings: 4000, secondsLeft: null });
  });
});

describe('sample configuration from the environment', () => {
  it('defaults to 2 GiB uploads and one job at a time', () => {
    expect(readSampleConfig({})).toMatchObject({ uploadMaxBytes: 2 * 1024 ** 3, maxJobs: 1 });
    expect(readSampleConfig({}).jobThreads).toBeGreaterThanOrEqual(1);
  });
  it('names a variable that is wrong', () => {
    expect(() => readSampleConfig({ SPLITFIELD_MAX_JOBS: '0' })).toThrow(/SPLITFIELD_MAX_JOBS must be at least 1/);
    expect(() => readSampleConfig({ SPLITFIELD_UPLOAD_MAX_BYTES: '2GB' })).toThrow(/SPLITFIELD_UPLOAD_MAX_BYTES must be a whole number/);
  });
});
