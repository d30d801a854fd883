// What a new region, a change of one, a comment and a category may contain (zod), with messages naming the field.
import { z } from 'zod';
import { plainName } from '@/lib/api/schemas';
import { COMMENT_BODY_MAX, REGION_CATEGORY_NAME_MAX, REGION_STATES, REGION_TITLE_MAX } from '@/models/vocabulary';
import { regionGeometrySchema } from './geometry-schema';

export const regionTitleSchema = plainName(
  z
    .string({ error: 'Title is required' })
    .trim()
    .min(1, 'Title must not be empty')
    .max(REGION_TITLE_MAX, `Title must be at most ${REGION_TITLE_MAX} characters`),
  'Title',
);

export const commentBodySchema = z
  .string({ error: 'Comment must be text' })
  .refine((body) => body.trim().length > 0, 'Comment must not be empty')
  .refine((body) => body.length <= COMMENT_BODY_MAX, `Comment must be at most ${COMMENT_BODY_MAX} characters`);

const optionalId = (what: string) => z.number({ error: `${what} must be an id` }).int(`${what} must be an id`).positive(`${what} must be an id`);

export const newRegionSchema = z.strictObject({
  title: regionTitleSchema,
  categoryId: optionalId('categoryId').nullable().optional(),
  /** The region's first comment. */
  comment: commentBodySchema,
  entryId: optionalId('entryId').nullable().optional(),
  geometry: regionGeometrySchema,
});

export const regionChangeSchema = z
  .strictObject({
    title: regionTitleSchema.optional(),
    categoryId: optionalId('categoryId').nullable().optional(),
    geometry: regionGeometrySchema.optional(),
    state: z.enum(REGION_STATES, { error: `state must be one of ${REGION_STATES.join(', ')}` }).optional(),
  })
  .refine((value) => Object.values(value).some((field) => field !== undefined), 'Give at least one field to change');

export const newCommentSchema = z.strictObject({
  body: commentBodySchema,
  replyToId: optionalId('replyToId').nullable().optional(),
});

export const commentChangeSchema = z.strictObject({ body: commentBodySchema });

const categoryName = plainName(
  z
    .string({ error: 'Name is required' })
    .trim()
    .min(1, 'Name must not be empty')
    .max(REGION_CATEGORY_NAME_MAX, `Name must be at most ${REGION_CATEGORY_NAME_MAX} characters`),
  'Name',
);
const colour = z
  .string({ error: 'Colour is required' })
  .regex(/^#[0-9a-fA-F]{6}$/, 'Colour must be #rrggbb (six hexadecimal digits)')
  .transform((value) => value.toLowerCase());

export const newCategorySchema = z.strictObject({ name: categoryName, colour });

export const categoryChangeSchema = z
  .strictObject({ name: categoryName.optional(), colour: colour.optional() })
  .refine((value) => value.name !== undefined || value.colour !== undefined, 'Give at least one field to change');

export type NewRegion = z.output<typeof newRegionSchema>;
