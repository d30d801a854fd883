// The text fields of an upload (multipart/form-data), checked with zod. Multipart fields are strings, so numbers,
// the tag list, the settings object and the force flag are decoded here, with messages naming the field.
import { z } from 'zod';
import { idParam, plainName } from '@/lib/api/schemas';
import {
  SAMPLE_DESCRIPTION_MAX,
  SAMPLE_LABEL_MAX,
  SAMPLE_NAME_MAX,
  SAMPLE_TAG_MAX,
  SAMPLE_TAGS_MAX,
} from '@/models/vocabulary';
import { settingsInputSchema } from '../ingest/settings';

/** Text that must be JSON; the parsed value goes on to `schema`. */
function jsonText<T>(field: string, schema: z.ZodType<T>) {
  return z
    .string()
    .transform((text, context) => {
      try {
        return JSON.parse(text) as unknown;
      } catch {
        context.addIssue({ code: 'custom', message: `${field} must be JSON` });
        return z.NEVER;
      }
    })
    .pipe(schema);
}

const tagSchema = plainName(
  z
    .string()
    .trim()
    .min(1, 'a tag must not be empty')
    .max(SAMPLE_TAG_MAX, `a tag must be at most ${SAMPLE_TAG_MAX} characters`),
  'a tag',
);

const tagListSchema = z
  .array(tagSchema, { error: 'tags must be comma-separated words or a JSON array of strings' })
  .max(SAMPLE_TAGS_MAX, `at most ${SAMPLE_TAGS_MAX} tags`)
  .transform((tags) => [...new Set(tags)]);

/** "a, b" or '["a","b"]'; an empty text is no tags. Text that is not a list fails in tagListSchema. */
const tagsField = z
  .string()
  .transform((text): unknown => {
    const trimmed = text.trim();
    if (!trimmed.startsWith('[')) return trimmed.split(',').map((tag) => tag.trim()).filter(Boolean);
    try {
      return JSON.parse(trimmed);
    } catch {
      return trimmed;
    }
  })
  .pipe(tagListSchema);

const flagField = z
  .enum(['', '0', '1', 'false', 'true'], { error: 'must be 1, 0, true or false' })
  .transform((value) => value === '1' || value === 'true');

export const sampleNameSchema = plainName(
  z
    .string({ error: 'name is required' })
    .trim()
    .min(1, 'name must not be empty')
    .max(SAMPLE_NAME_MAX, `name must be at most ${SAMPLE_NAME_MAX} characters`),
  'name',
);

export const uploadFieldsSchema = z.strictObject({
  studyId: z.string({ error: 'studyId is required: the study to attach the sample to' }).pipe(idParam),
  name: sampleNameSchema,
  label: plainName(
    z.string().trim().max(SAMPLE_LABEL_MAX, `label must be at most ${SAMPLE_LABEL_MAX} characters`),
    'label',
  ).default(''),
  description: z
    .string()
    .max(SAMPLE_DESCRIPTION_MAX, `description must be at most ${SAMPLE_DESCRIPTION_MAX} characters`)
    .default(''),
  tags: tagsField.default([]),
  settings: jsonText('settings', settingsInputSchema).default(() => settingsInputSchema.parse({})),
  force: flagField.default(false),
});

export type UploadFields = z.output<typeof uploadFieldsSchema>;
