// The saved settings of a Separation entry: which sample is the signal and which the background, the plane view
// they are compared on (the Maps' view-settings.ts: binning and jet selection), the entries threshold of the ln-ratio
// table, how the ROC is drawn, and the region proposals saved with the entry, in the geometry Regions store (so a
// saved proposal can become a Region).
import { z } from 'zod';
import { ENTRY_TITLE_MAX } from '@/models/vocabulary';
import { plainName } from '@/lib/api/schemas';
import { planeViewSchema } from '@/lib/maps/view-settings';
import { regionGeometrySchema } from '@/lib/regions/geometry-schema';

const id = (name: string) => z.number({ error: `${name} must be a sample id` }).int(`${name} must be a whole number`).positive(`${name} must be positive`);

/** Most region proposals one entry keeps. */
export const MAX_SAVED_REGIONS = 50;

export const savedRegionSchema = z.strictObject({
  title: plainName(z.string({ error: 'title must be text' }).trim().min(1, 'title must not be empty').max(ENTRY_TITLE_MAX, `title must be at most ${ENTRY_TITLE_MAX} characters`), 'title'),
  /** The proposal's rank when it was saved (null for a region drawn by hand). */
  rank: z.number().int().min(1).nullable().default(null),
  geometry: regionGeometrySchema,
});

export const minEntriesSchema = z.number({ error: 'minEntries must be a number' }).int('minEntries must be a whole number').min(0, 'minEntries must be at least 0').max(1e9, 'minEntries must be at most 1e9');

export const separationSettingsSchema = z
  .strictObject({
    signalSampleId: id('signalSampleId'),
    backgroundSampleId: id('backgroundSampleId'),
    view: planeViewSchema.default(() => planeViewSchema.parse({})),
    /** Bins with fewer raw splittings than this in either training half are masked (left out of the table). */
    minEntries: minEntriesSchema.default(10),
    display: z
      .strictObject({ rocAxis: z.enum(['linear', 'log'], { error: 'display.rocAxis must be linear or log' }).default('log') })
      .default({ rocAxis: 'log' }),
    savedRegions: z.array(savedRegionSchema, { error: 'savedRegions must be a list' }).max(MAX_SAVED_REGIONS, `at most ${MAX_SAVED_REGIONS} saved regions`).default([]),
  })
  .refine((s) => s.signalSampleId !== s.backgroundSampleId, { error: 'backgroundSampleId must differ from signalSampleId', path: ['backgroundSampleId'] });

export type SeparationSettings = z.output<typeof separationSettingsSchema>;
export type SavedRegion = z.output<typeof savedRegionSchema>;
