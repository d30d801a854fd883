import path from 'node:path';
import { z } from 'zod';

/** Where the server keeps its files and listens; read from the environment, with defaults for a local run. */
/** Environment variables by name; process.env or a test's own. */
export type Environment = Record<string, string | undefined>;

export interface ServerConfig {
  storageDir: string;
  databasePath: string;
  host: string;
  port: number;
}

const environmentSchema = z.object({
  SPLITFIELD_STORAGE: z.string().trim().min(1).optional(),
  SPLITFIELD_DB: z.string().trim().min(1).optional(),
  HOST: z.string().trim().min(1).optional(),
  PORT: z
    .string()
    .regex(/^\d+$/, 'must be a whole number')
    .transform(Number)
    .refine((port) => port >= 1 && port <= 65535, 'must be between 1 and 65535')
    .optional(),
});

/** A variable holding a whole number of at least `minimum`. */
export const wholeNumberVariable = (minimum: number) =>
  z
    .string()
    .trim()
    .regex(/^\d+$/, 'must be a whole number')
    .transform(Number)
    .refine((value) => Number.isSafeInteger(value) && value >= minimum, `must be at least ${minimum}`);

/** The environment checked against `schema`; throws naming each variable that is wrong. */
export function checkedEnvironment<T>(schema: z.ZodType<T>, env: Environment): T {
  const parsed = schema.safeParse(env);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((issue) => `${issue.path.join('.')} ${issue.message}`);
    throw new Error(`Invalid environment variable: ${problems.join('; ')}`);
  }
  return parsed.data;
}

export function readConfig(env: Environment = process.env): ServerConfig {
  const values = checkedEnvironment(environmentSchema, env);
  // The ignore comments stop the bundler from tracing the whole project: these paths are only known at run time.
  const storageDir = path.resolve(/*turbopackIgnore: true*/ values.SPLITFIELD_STORAGE ?? 'storage');
  const databasePath = values.SPLITFIELD_DB ?? path.join(storageDir, 'splitfield.sqlite');
  return {
    storageDir,
    databasePath: path.resolve(/*turbopackIgnore: true*/ databasePath),
    host: values.HOST ?? '127.0.0.1',
    port: values.PORT ?? 3000,
  };
}
