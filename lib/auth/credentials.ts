import { z } from 'zod';
import { db } from '../db/connection';
import { passwordMatches } from './password';
import { emailSchema } from '../api/schemas';
import type { User } from '@/models/user';

/** Thrown for a right password on a disabled account; next-auth passes the message on as the sign-in error code. */
export const ACCOUNT_DISABLED = 'AccountDisabled';

const credentialsSchema = z.object({ email: emailSchema, password: z.string().min(1) });

/** The user these sign-in form fields name, if the password is right; null for anything else. */
export async function verifyCredentials(fields: unknown): Promise<User | null> {
  const parsed = credentialsSchema.safeParse(fields);
  if (!parsed.success) return null;
  const user = await db().models.User.findOne({ where: { email: parsed.data.email } });
  const matches = await passwordMatches(parsed.data.password, user?.passwordHash);
  if (!user || !matches) return null;
  if (user.disabled) throw new Error(ACCOUNT_DISABLED);
  return user;
}
