// The saved settings of Map and Contrast entries: the samples, the view (view-settings.ts) and how it is drawn.
// The same object is what a view's page address holds, so a linked view opens exactly as it was shown.
import { z } from 'zod';
import { MAX_VIEW_SAMPLES } from './queries';
import { planeViewSchema } from './view-settings';

const id = z.number({ error: 'a sample id must be a number' }).int('a sample id must be a whole number').positive('a sample id must be positive');
const finiteOrNull = (what: string) => z.number({ error: `${what} must be a number or null` }).refine(Number.isFinite, `${what} must be finite`).nullable().default(null);

export const displaySchema = z.strictObject({
  colour: z.enum(['linear', 'log'], { error: 'display.colour must be linear or log' }).default('linear'),
  overlays: z
    .strictObject({
      radius: z.boolean().default(true),
      zEdges: z.boolean().default(true),
      ktBoundary: z.boolean().default(true),
      expectation: z.enum(['none', 'softCollinear', 'hardCollinear'], { error: 'display.overlays.expectation must be none, softCollinear or hardCollinear' }).default('none'),
      parton: z.enum(['quark', 'gluon'], { error: 'display.overlays.parton must be quark or gluon' }).default('quark'),
    })
    .default({ radius: true, zEdges: true, ktBoundary: true, expectation: 'none', parton: 'quark' }),
  projection: z
    .strictObject({
      onto: z.enum(['x', 'y'], { error: 'display.projection.onto must be x or y' }).default('y'),
      from: finiteOrNull('display.projection.from'),
      to: finiteOrNull('display.projection.to'),
    })
    .nullable()
    .default(null),
});

export const boxSchema = z
  .strictObject({ x1: z.number().refine(Number.isFinite), x2: z.number().refine(Number.isFinite), y1: z.number().refine(Number.isFinite), y2: z.number().refine(Number.isFinite) })
  .refine((b) => b.x1 !== b.x2 && b.y1 !== b.y2, 'box: the corners must differ in both coordinates');

export const mapSettingsSchema = z.strictObject({
  sampleId: id,
  view: planeViewSchema.default(() => planeViewSchema.parse({})),
  display: displaySchema.default(() => displaySchema.parse({})),
});

export const contrastSettingsSchema = z.strictObject({
  sampleIds: z
    .array(id, { error: 'sampleIds must be a list of sample ids' })
    .min(2, 'a contrast needs at least two samples')
    .max(MAX_VIEW_SAMPLES, `a contrast compares at most ${MAX_VIEW_SAMPLES} samples`)
    .refine((ids) => new Set(ids).size === ids.length, 'sampleIds must not name a sample twice'),
  view: planeViewSchema.default(() => planeViewSchema.parse({})),
  display: displaySchema.default(() => displaySchema.parse({})),
  mode: z.enum(['ratio', 'difference', 'pull'], { error: 'mode must be ratio, difference or pull' }).default('ratio'),
  minEntries: z.number().int('minEntries must be a whole number').min(0, 'minEntries must be at least 0').max(1e9).default(10),
  box: boxSchema.nullable().default(null),
});

export type DisplaySettings = z.output<typeof displaySchema>;
export type MapSettings = z.output<typeof mapSettingsSchema>;
export type ContrastSettings = z.output<typeof contrastSettingsSchema>;
export type Box = z.output<typeof boxSchema>;
