import { randomBytes } from 'node:crypto';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { readConfig, type Environment } from '../config/environment';

// The key that signs and encrypts session tokens. It lives in storage/ (never in the repository) unless the
// environment gives one, so restarts keep people signed in and each installation has its own.
const SECRET_FILE = 'nextauth-secret';

function storedSecret(storageDir: string): string | undefined {
  const file = path.join(storageDir, SECRET_FILE);
  return existsSync(file) ? readFileSync(file, 'utf8').trim() : undefined;
}

/** The environment's secret, else the one in storage/, else a new one written there (readable by the owner only). */
export function ensureAuthSecret(storageDir: string, env: Environment = process.env): string {
  const existing = env.NEXTAUTH_SECRET || storedSecret(storageDir);
  if (existing) return existing;
  const secret = randomBytes(32).toString('base64url');
  writeFileSync(path.join(storageDir, SECRET_FILE), `${secret}\n`, { mode: 0o600, flag: 'wx' });
  return secret;
}

/** The secret the running server uses; `npm start` has made sure that one exists. */
export function authSecret(): string {
  const storageDir = readConfig().storageDir;
  const secret = process.env.NEXTAUTH_SECRET || storedSecret(storageDir);
  if (!secret) {
    throw new Error(`No NEXTAUTH_SECRET in the environment and none in ${storageDir}: start with "npm start".`);
  }
  return secret;
}
