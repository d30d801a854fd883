// What a new entry or a change of one may contain, by kind: a Note is Markdown; a Map, a Contrast or a Separation
// has settings (lib/maps/entry-settings.ts, lib/separations/settings.ts) that name samples of the study, and an
// optional Markdown caption.
import type { Transaction } from 'sequelize';
import { z } from 'zod';
import { badRequest } from '@/lib/api/errors';
import { entryTitleSchema, noteBodySchema } from '@/lib/api/schemas';
import { issueDetails } from '@/lib/api/validation';
import { requireStudySamples } from '@/lib/maps/entry-samples';
import { type ContrastSettings, contrastSettingsSchema, type MapSettings, mapSettingsSchema } from '@/lib/maps/entry-settings';
import { type SeparationSettings, separationSettingsSchema } from '@/lib/separations/settings';
import type { EntryKind } from '@/models/vocabulary';

export const newEntrySchema = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({ kind: z.literal('note'), title: entryTitleSchema.optional(), body: noteBodySchema }),
    z.strictObject({ kind: z.literal('map'), title: entryTitleSchema.optional(), body: noteBodySchema.optional(), settings: mapSettingsSchema }),
    z.strictObject({ kind: z.literal('contrast'), title: entryTitleSchema.optional(), body: noteBodySchema.optional(), settings: contrastSettingsSchema }),
    z.strictObject({ kind: z.literal('separation'), title: entryTitleSchema.optional(), body: noteBodySchema.optional(), settings: separationSettingsSchema }),
  ],
  { error: 'kind must be "note", "map", "contrast" or "separation"' },
);

export type NewEntry = z.output<typeof newEntrySchema>;

const SETTINGS_SCHEMAS = { map: mapSettingsSchema, contrast: contrastSettingsSchema, separation: separationSettingsSchema } as const;

/** An entry's new settings checked against its kind; 400 naming each problem under "settings.". */
export function checkedSettings(kind: EntryKind, value: unknown): Record<string, unknown> {
  if (kind === 'note') {
    throw badRequest(`Invalid request body: settings: a ${kind} has no settings`, [{ path: 'settings', message: `a ${kind} has no settings` }]);
  }
  const parsed = SETTINGS_SCHEMAS[kind].safeParse(value);
  if (!parsed.success) {
    const details = issueDetails(parsed.error).map((d) => ({ path: d.path === '(body)' ? 'settings' : `settings.${d.path}`, message: d.message }));
    throw badRequest(`Invalid request body: ${details.map((d) => `${d.path}: ${d.message}`).join('; ')}`, details);
  }
  return parsed.data;
}

/** The sample ids an entry's settings name, and where in the settings they are. */
function namedSamples(kind: Exclude<EntryKind, 'note'>, settings: Record<string, unknown>): { ids: number[]; path: string } {
  if (kind === 'map') return { ids: [(settings as MapSettings).sampleId], path: 'settings.sampleId' };
  if (kind === 'contrast') return { ids: (settings as ContrastSettings).sampleIds, path: 'settings.sampleIds' };
  const s = settings as SeparationSettings;
  return { ids: [s.signalSampleId, s.backgroundSampleId], path: 'settings' };
}

/** 400 unless every sample the settings name belongs to the study. */
export async function requireEntrySamples(studyId: number, kind: EntryKind, settings: Record<string, unknown>, transaction: Transaction): Promise<void> {
  if (kind === 'note') return;
  const { ids, path } = namedSamples(kind, settings);
  await requireStudySamples(studyId, ids, path, transaction);
}
