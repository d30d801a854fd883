// Input shapes shared by several routes, with messages that say what is wrong in words a person can act on.
import { z } from 'zod';
import {
  ENTRY_TITLE_MAX,
  NOTE_BODY_MAX,
  PASSWORD_MAX,
  PASSWORD_MIN,
  STUDY_DESCRIPTION_MAX,
  STUDY_ROLES,
  STUDY_TITLE_MAX,
  USER_NAME_MAX,
} from '@/models/vocabulary';
import { bidiControlIn, bidiControlMessage } from './text-rules';

/** Refuses text with bidirectional control characters (see text-rules.ts), naming the field and the character. */
export function plainName<T extends z.ZodType<string>>(schema: T, what: string) {
  return schema.check((context) => {
    if (bidiControlIn(context.value) !== null) {
      context.issues.push({ code: 'custom', message: bidiControlMessage(what, context.value), input: context.value });
    }
  });
}

export const emailSchema = z
  .string({ error: 'E-mail is required' })
  .trim()
  .toLowerCase()
  .max(254, 'E-mail must be at most 254 characters')
  .pipe(z.email({ error: 'E-mail is not a valid address' }));

export const passwordSchema = z
  .string({ error: 'Password is required' })
  .min(PASSWORD_MIN, `Password must be at least ${PASSWORD_MIN} characters`)
  .refine((password) => Buffer.byteLength(password) <= PASSWORD_MAX, `Password must be at most ${PASSWORD_MAX} bytes`);

export const userNameSchema = plainName(
  z
    .string({ error: 'Name is required' })
    .trim()
    .min(1, 'Name must not be empty')
    .max(USER_NAME_MAX, `Name must be at most ${USER_NAME_MAX} characters`),
  'Name',
);

export const studyTitleSchema = plainName(
  z
    .string({ error: 'Title is required' })
    .trim()
    .min(1, 'Title must not be empty')
    .max(STUDY_TITLE_MAX, `Title must be at most ${STUDY_TITLE_MAX} characters`),
  'Title',
);

export const studyDescriptionSchema = z
  .string({ error: 'Description must be text' })
  .max(STUDY_DESCRIPTION_MAX, `Description must be at most ${STUDY_DESCRIPTION_MAX} characters`);

export const studyRoleSchema = z.enum(STUDY_ROLES, { error: `Role must be one of: ${STUDY_ROLES.join(', ')}` });

/** A database id in a URL: digits only, no leading zero, small enough to be exact. */
export const idParam = z
  .string()
  .regex(/^[1-9]\d{0,14}$/, 'is not an id')
  .transform(Number);

/** For PATCH bodies: all fields optional, but at least one given. */
export function atLeastOneField<T extends z.ZodRawShape>(shape: T) {
  return z
    .strictObject(shape)
    .refine((value) => Object.values(value).some((field) => field !== undefined), 'Give at least one field to change');
}

export const entryTitleSchema = plainName(
  z
    .string({ error: 'Title must be text' })
    .trim()
    .max(ENTRY_TITLE_MAX, `Title must be at most ${ENTRY_TITLE_MAX} characters`),
  'Title',
);

export const noteBodySchema = z
  .string({ error: 'Body is required and must be text (Markdown)' })
  .max(NOTE_BODY_MAX, `Body must be at most ${NOTE_BODY_MAX} characters`);

/** The token of a link sent by mail (lib/auth/signed-links.ts); its signature is checked where it is used. */
export const signedTokenSchema = z
  .string({ error: 'Token is required' })
  .min(1, 'Token must not be empty')
  .max(100, 'Token must be at most 100 characters');
