// Query strings of the map, contrast and projection routes, checked with zod. The view's settings travel as one
// JSON parameter `view` (view-settings.ts), so that a page address and an API call carry the same object.
import { z } from 'zod';
import { planeViewSchema } from './view-settings';

/** The most samples one contrast or projection compares. */
export const MAX_VIEW_SAMPLES = 6;

export const viewParam = z
  .string()
  .max(4000, 'view must be at most 4000 characters of JSON')
  .transform((text, context) => {
    try {
      return JSON.parse(text) as unknown;
    } catch {
      context.addIssue({ code: 'custom', message: 'view must be a JSON object (view-settings)' });
      return z.NEVER;
    }
  })
  .pipe(planeViewSchema)
  .default(() => planeViewSchema.parse({}));

export const EXPORT_FORMATS = ['csv', 'json', 'yaml', 'provenance'] as const;
export type ExportFormat = (typeof EXPORT_FORMATS)[number];
const formatParam = z.enum(EXPORT_FORMATS, { error: `format must be one of ${EXPORT_FORMATS.join(', ')}` }).optional();

export const sampleIdsParam = (least: number) =>
  z
    .string({ error: 'samples is required: sample ids separated by commas' })
    .regex(/^[1-9]\d{0,14}(,[1-9]\d{0,14})*$/, 'samples must be sample ids separated by commas')
    .transform((text) => text.split(',').map(Number))
    .refine((ids) => ids.length >= least && ids.length <= MAX_VIEW_SAMPLES, `samples must name ${least} to ${MAX_VIEW_SAMPLES} samples`)
    .refine((ids) => new Set(ids).size === ids.length, 'samples must not name a sample twice');

const numberText = (name: string) =>
  z
    .string()
    .trim()
    .min(1, `${name} must be a number`)
    .transform(Number)
    .refine(Number.isFinite, `${name} must be a finite number`);

export const mapQuery = z.strictObject({ view: viewParam, format: formatParam });

export const contrastQuery = z.strictObject({
  samples: sampleIdsParam(2),
  view: viewParam,
  mode: z.enum(['ratio', 'difference', 'pull'], { error: 'mode must be ratio, difference or pull' }).default('ratio'),
  minEntries: z
    .string()
    .regex(/^\d{1,9}$/, 'minEntries must be a whole number')
    .transform(Number)
    .default(() => 10),
  format: formatParam,
});

export const projectionQuery = z.strictObject({
  samples: sampleIdsParam(1),
  view: viewParam,
  onto: z.enum(['x', 'y'], { error: 'onto must be x or y' }).default('y'),
  from: numberText('from').optional(),
  to: numberText('to').optional(),
  format: formatParam,
});

export type MapQuery = z.output<typeof mapQuery>;
export type ContrastQuery = z.output<typeof contrastQuery>;
export type ProjectionQuery = z.output<typeof projectionQuery>;
