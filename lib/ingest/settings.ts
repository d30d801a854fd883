// Processing settings given at upload: a partial JSON object checked with zod, completed with the defaults of
// PHYSICS.md (anti-kt, R = 0.4, pt > 20 GeV, |y| < 2.5) and common practice (SoftDrop z_cut = 0.1, β = 0,
// R0 = R; multiplicity kt cut 1 GeV), and the jet-definition settings: exclusive jets, the collision type and the
// e+e- algorithms, the constituent selection and flavour tags (all off by default: the hadron-collider inclusive
// jets of every particle).
import { z } from 'zod';
import { NO_SELECTION, selectsAll } from '@/lib/physics/constituent-selection';
import type { CompleteSampleSettings, SampleSettings } from '@/models/sample-fields';

const finite = (what: string) => z.number({ error: `${what} must be a number` }).refine(Number.isFinite, `${what} must be finite`);
const positive = (what: string) => finite(what).refine((v) => v > 0, `${what} must be > 0`);

const exclusiveSchema = z.union(
  [
    z.strictObject({ n: z.number({ error: 'jet.exclusive.n must be a whole number' }).int('jet.exclusive.n must be a whole number').min(1, 'jet.exclusive.n must be at least 1') }),
    z.strictObject({ dcut: positive('jet.exclusive.dcut') }),
    z.strictObject({ ycut: positive('jet.exclusive.ycut') }),
  ],
  { error: 'jet.exclusive must be null, {"n": N}, {"dcut": D} or {"ycut": Y}' },
);

const jetSchema = z.strictObject({
  algorithm: z.enum(['antikt', 'kt', 'ca'], { error: 'jet.algorithm must be "antikt", "kt" or "ca"' }).default('antikt'),
  R: finite('jet.R').refine((r) => r > 0 && r <= 10, 'jet.R must be in (0, 10]').default(0.4),
  ptMin: finite('jet.ptMin').refine((v) => v >= 0, 'jet.ptMin must be >= 0 (GeV)').default(20),
  yMax: finite('jet.yMax').refine((v) => v > 0, 'jet.yMax must be > 0').default(2.5),
  maxJets: z
    .number({ error: 'jet.maxJets must be a whole number or null (all jets)' })
    .int('jet.maxJets must be a whole number')
    .min(1, 'jet.maxJets must be at least 1')
    .nullable()
    .default(null),
  exclusive: exclusiveSchema.nullable().default(null),
});

const softDropSchema = z.strictObject({
  zCut: finite('softDrop.zCut').refine((v) => v >= 0 && v < 1, 'softDrop.zCut must be in [0, 1)').default(0.1),
  beta: finite('softDrop.beta').default(0),
  /** Missing: the jet radius R. */
  R0: finite('softDrop.R0').refine((v) => v > 0, 'softDrop.R0 must be > 0').optional(),
  mode: z.enum(['grooming', 'tagging'], { error: 'softDrop.mode must be "grooming" or "tagging"' }).default('grooming'),
});

const eeSchema = z.strictObject({
  algorithm: z.enum(['durham', 'cambridge', 'genkt'], { error: 'ee.algorithm must be "durham", "cambridge" or "genkt"' }).default('durham'),
  p: finite('ee.p').default(-1),
  eMin: finite('ee.eMin').refine((v) => v >= 0, 'ee.eMin must be >= 0 (GeV)').default(0),
});

const pidList = (what: string) =>
  z
    .array(z.number({ error: `${what} must list whole numbers` }).int(`${what} must list whole numbers`), { error: `${what} must be an array of particle codes` })
    .max(500, `${what} lists at most 500 codes`)
    .default([]);

const particlesSchema = z.strictObject({
  dropNeutrinos: z.boolean({ error: 'particles.dropNeutrinos must be true or false' }).default(NO_SELECTION.dropNeutrinos),
  pidExclude: pidList('particles.pidExclude'),
  pidInclude: pidList('particles.pidInclude'),
  chargedOnly: z.boolean({ error: 'particles.chargedOnly must be true or false' }).default(NO_SELECTION.chargedOnly),
  ptMin: finite('particles.ptMin').refine((v) => v >= 0, 'particles.ptMin must be >= 0 (GeV)').default(NO_SELECTION.ptMin),
  rapidityMax: positive('particles.rapidityMax').nullable().default(NO_SELECTION.rapidityMax),
  rapidityKind: z.enum(['y', 'eta'], { error: 'particles.rapidityKind must be "y" or "eta"' }).default(NO_SELECTION.rapidityKind),
});

/** Combinations the engine does not define, with the field to name. */
function checkCombination(s: CompleteSampleSettings): Array<{ path: string[]; message: string }> {
  const ex = s.jet.exclusive;
  const problems: Array<{ path: string[]; message: string }> = [];
  if (s.collision === 'hadron') {
    if (ex && 'ycut' in ex) problems.push({ path: ['jet', 'exclusive'], message: 'jet.exclusive.ycut is for e+e- events (collision "ee"); use dcut or n' });
    else if (ex && s.jet.algorithm === 'antikt') problems.push({ path: ['jet', 'algorithm'], message: 'exclusive jets need jet.algorithm "kt" or "ca"' });
    else if (ex && s.flavourTags && s.jet.algorithm === 'ca') {
      problems.push({ path: ['flavourTags'], message: 'flavour tags with exclusive jets need jet.algorithm "kt" (a C/A ghost far from every particle would be a jet of its own)' });
    }
  } else if (s.ee.algorithm === 'durham') {
    if (!ex || 'dcut' in ex) problems.push({ path: ['jet', 'exclusive'], message: 'Durham jets need jet.exclusive {"n": N} or {"ycut": Y}' });
  } else if (s.ee.algorithm === 'cambridge') {
    if (!ex || !('ycut' in ex)) problems.push({ path: ['jet', 'exclusive'], message: 'e+e- Cambridge jets need jet.exclusive {"ycut": Y}' });
  } else if (ex) {
    problems.push({ path: ['jet', 'exclusive'], message: 'the generalised e+e- kt algorithm gives inclusive jets: leave jet.exclusive null' });
  }
  if (s.particles.pidInclude.length && s.particles.pidExclude.some((c) => s.particles.pidInclude.map(Math.abs).includes(Math.abs(c)))) {
    problems.push({ path: ['particles', 'pidExclude'], message: 'particles.pidExclude and particles.pidInclude name the same code' });
  }
  return problems;
}

export const settingsInputSchema = z
  .strictObject({
    jet: jetSchema.default(() => jetSchema.parse({})),
    softDrop: softDropSchema.default(() => softDropSchema.parse({})),
    multiplicityKtCut: finite('multiplicityKtCut').refine((v) => v >= 0, 'multiplicityKtCut must be >= 0 (GeV)').default(1),
    fullTree: z.boolean({ error: 'fullTree must be true or false' }).default(false),
    collision: z.enum(['hadron', 'ee'], { error: 'collision must be "hadron" or "ee"' }).default('hadron'),
    ee: eeSchema.default(() => eeSchema.parse({})),
    particles: particlesSchema.default(() => particlesSchema.parse({})),
    flavourTags: z.boolean({ error: 'flavourTags must be true or false' }).default(false),
  })
  .transform(
    (input): CompleteSampleSettings => ({
      jet: input.jet,
      softDrop: {
        zCut: input.softDrop.zCut,
        beta: input.softDrop.beta,
        R0: input.softDrop.R0 ?? input.jet.R,
        mode: input.softDrop.mode,
      },
      multiplicityKtCut: input.multiplicityKtCut,
      fullTree: input.fullTree,
      collision: input.collision,
      ee: input.ee,
      particles: input.particles,
      flavourTags: input.flavourTags,
    }),
  )
  .superRefine((s, ctx) => {
    for (const p of checkCombination(s)) ctx.addIssue({ code: 'custom', message: p.message, path: p.path });
  });

/** The complete default settings. */
export function defaultSettings(): CompleteSampleSettings {
  return settingsInputSchema.parse({});
}

/** Stored settings with every field filled (samples made before a setting existed had its default). */
export function completeSettings(s: SampleSettings): CompleteSampleSettings {
  const d = defaultSettings();
  return {
    ...d,
    ...s,
    jet: { ...s.jet, exclusive: s.jet.exclusive ?? null },
    softDrop: { ...s.softDrop, mode: s.softDrop.mode ?? d.softDrop.mode },
    ee: s.ee ?? d.ee,
    particles: s.particles ?? d.particles,
    collision: s.collision ?? d.collision,
    flavourTags: s.flavourTags ?? d.flavourTags,
  };
}

/**
 * The generation of the engine's stored results: raised whenever the same file and settings would be stored
 * differently, so that a sample made by an older engine is never offered as a duplicate of a new upload.
 * 1: the first engine; 2: SoftDrop in grooming mode by default, and the fine grid widened to ln kt from −20.
 */
export const RESULTS_GENERATION = 2;

/**
 * The key of a sample's stored results: the generation of the engine and every setting, in a fixed order, so
 * that equal keys mean equal results for the same file.
 */
export function settingsKey(s: SampleSettings): string {
  const c = completeSettings(s);
  const { jet, softDrop, ee, particles: p } = c;
  return JSON.stringify([
    RESULTS_GENERATION,
    [jet.algorithm, jet.R, jet.ptMin, jet.yMax, jet.maxJets, jet.exclusive],
    [softDrop.zCut, softDrop.beta, softDrop.R0, softDrop.mode],
    c.multiplicityKtCut,
    c.fullTree,
    c.collision,
    c.collision === 'ee' ? [ee.algorithm, ee.p, ee.eMin] : null,
    selectsAll(p) ? null : [p.dropNeutrinos, p.pidExclude, p.pidInclude, p.chargedOnly, p.ptMin, p.rapidityMax, p.rapidityKind],
    c.flavourTags,
  ]);
}
