// What a new entry or a change of one may contain, by kind: a Note is Markdown; a Map or a Contrast has settings
// (lib/maps/entry-settings.ts) that name samples of the study, and an optional Markdown caption.
import type { Transaction } from 'sequelize';
import { z } from 'zod';
import { badRequest } from '@/lib/api/errors';
import { entryTitleSchema, noteBodySchema } from '@/lib/api/schemas';
import { issueDetails } from '@/lib/api/validation';
import { requireStudySamples } from '@/lib/maps/entry-samples';
import { contrastSettingsSchema, entrySampleIds, mapSettingsSchema } from '@/lib/maps/entry-settings';
import type { EntryKind } from '@/models/vocabulary';

export const newEntrySchema = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({ kind: z.literal('note'), title: entryTitleSchema.optional(), body: noteBodySchema }),
    z.strictObject({ kind: z.literal('map'), title: entryTitleSchema.optional(), body: noteBodySchema.optional(), settings: mapSettingsSchema }),
    z.strictObject({ kind: z.literal('contrast'), title: entryTitleSchema.optional(), body: noteBodySchema.optional(), settings: contrastSettingsSchema }),
  ],
  { error: 'kind must be "note", "map" or "contrast" (separations cannot be created yet)' },
);

export type NewEntry = z.output<typeof newEntrySchema>;

const SETTINGS_SCHEMAS = { map: mapSettingsSchema, contrast: contrastSettingsSchema } as const;

/** An entry's new settings checked against its kind; 400 naming each problem under "settings.". */
export function checkedSettings(kind: EntryKind, value: unknown): Record<string, unknown> {
  if (kind !== 'map' && kind !== 'contrast') {
    throw badRequest(`Invalid request body: settings: a ${kind} has no settings`, [{ path: 'settings', message: `a ${kind} has no settings` }]);
  }
  const parsed = SETTINGS_SCHEMAS[kind].safeParse(value);
  if (!parsed.success) {
    const details = issueDetails(parsed.error).map((d) => ({ path: d.path === '(body)' ? 'settings' : `settings.${d.path}`, message: d.message }));
    throw badRequest(`Invalid request body: ${details.map((d) => `${d.path}: ${d.message}`).join('; ')}`, details);
  }
  return parsed.data;
}

/** 400 unless every sample the settings name belongs to the study. */
export async function requireEntrySamples(studyId: number, kind: EntryKind, settings: Record<string, unknown>, transaction: Transaction): Promise<void> {
  if (kind !== 'map' && kind !== 'contrast') return;
  const path = kind === 'map' ? 'settings.sampleId' : 'settings.sampleIds';
  await requireStudySamples(studyId, entrySampleIds(kind, settings as never), path, transaction);
}
