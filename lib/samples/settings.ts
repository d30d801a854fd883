// Processing settings given at upload: a partial JSON object checked with zod, completed with the defaults of
// PHYSICS.md (anti-kt, R = 0.4, pt > 20 GeV, |y| < 2.5) and common practice (SoftDrop z_cut = 0.1, β = 0,
// R0 = R; multiplicity kt cut 1 GeV).
import { z } from 'zod';
import type { SampleSettings } from '@/models/sample-fields';

const finite = (what: string) => z.number({ error: `${what} must be a number` }).refine(Number.isFinite, `${what} must be finite`);

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
});

const softDropSchema = z.strictObject({
  zCut: finite('softDrop.zCut').refine((v) => v >= 0 && v < 1, 'softDrop.zCut must be in [0, 1)').default(0.1),
  beta: finite('softDrop.beta').default(0),
  /** Missing: the jet radius R. */
  R0: finite('softDrop.R0').refine((v) => v > 0, 'softDrop.R0 must be > 0').optional(),
  mode: z.enum(['grooming', 'tagging'], { error: 'softDrop.mode must be "grooming" or "tagging"' }).default('grooming'),
});

export const settingsInputSchema = z
  .strictObject({
    jet: jetSchema.default(() => jetSchema.parse({})),
    softDrop: softDropSchema.default(() => softDropSchema.parse({})),
    multiplicityKtCut: finite('multiplicityKtCut').refine((v) => v >= 0, 'multiplicityKtCut must be >= 0 (GeV)').default(1),
    fullTree: z.boolean({ error: 'fullTree must be true or false' }).default(false),
  })
  .transform(
    (input): SampleSettings => ({
      jet: input.jet,
      softDrop: {
        zCut: input.softDrop.zCut,
        beta: input.softDrop.beta,
        R0: input.softDrop.R0 ?? input.jet.R,
        mode: input.softDrop.mode,
      },
      multiplicityKtCut: input.multiplicityKtCut,
      fullTree: input.fullTree,
    }),
  );

/** The complete default settings. */
export function defaultSettings(): SampleSettings {
  return settingsInputSchema.parse({});
}

/** The settings as text with a fixed key order: equal settings give equal keys. */
export function settingsKey(s: SampleSettings): string {
  const { algorithm, R, ptMin, yMax, maxJets } = s.jet;
  const { zCut, beta, R0, mode } = s.softDrop;
  const key = [algorithm, R, ptMin, yMax, maxJets, zCut, beta, R0, s.multiplicityKtCut, s.fullTree];
  // Grooming is the default: keys of samples stored before the mode existed stay the same.
  return JSON.stringify(mode === 'tagging' ? [...key, mode] : key);
}
