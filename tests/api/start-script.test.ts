// `npm start` (scripts/start.mjs) end to end: prepares a new storage folder, prints the demo credentials on the
// first start only, and serves the app. It serves the existing build; it would rebuild a stale one first.
import { spawn } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { DEMO_CREDENTIALS_FILE } from '@/lib/demo/seed';
import { signIn } from '../support/server';

const repoRoot = path.resolve(__dirname, '..', '..');
const storageDir = mkdtempSync(path.join(os.tmpdir(), 'splitfield-start-'));
afterAll(() => rmSync(storageDir, { recursive: true, force: true }));

function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const probe = createServer().listen(0, '127.0.0.1', () => {
      const { port } = probe.address() as { port: number };
      probe.close(() => resolve(port));
    });
  });
}

/** Runs `npm start` until it serves, hands back what it printed, then stops it. */
async function startOnce(): Promise<{ printed: string; baseUrl: string }> {
  const port = await freePort();
  const child = spawn(process.execPath, ['scripts/start.mjs'], {
    cwd: repoRoot,
    env: { ...process.env, SPLITFIELD_STORAGE: storageDir, PORT: String(port), HOST: '127.0.0.1', NEXTAUTH_SECRET: '' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let printed = '';
  child.stdout.on('data', (chunk) => (printed += chunk));
  child.stderr.on('data', (chunk) => (printed += chunk));
  const exited = new Promise((resolve) => child.once('exit', resolve));
  const baseUrl = `http://127.0.0.1:${port}`;
  try {
    const deadline = Date.now() + 170_000;
    for (;;) {
      if (child.exitCode !== null) throw new Error(`npm start exited:\n${printed}`);
      if (Date.now() > deadline) throw new Error(`npm start did not serve in time:\n${printed}`);
      const ok = await fetch(`${baseUrl}/api/auth/csrf`).then((response) => response.ok, () => false);
      if (ok) break;
      await new Promise((resolve) => setTimeout(resolve, 200));
    }
    // Sign-in works with the generated secret and the NEXTAUTH_URL the script derived from HOST and PORT.
    const [, email, password] = readFileSync(path.join(storageDir, DEMO_CREDENTIALS_FILE), 'utf8').match(/^admin\s+(\S+)\s+(\S+)/m)!;
    const admin = await signIn(baseUrl, email, password);
    expect((await admin.get('/api/me')).body.user.siteRole).toBe('admin');
    return { printed, baseUrl };
  } finally {
    child.kill('SIGTERM');
    await exited;
  }
}

describe('npm start', () => {
  it('prepares storage and prints the demo credentials on the first start only', async () => {
    const first = await startOnce();
    expect(first.printed).toContain('applied 0001-foundation');
    expect(first.printed).toMatch(/^admin\s+\S+@\S+\s+\S+/m);
    expect(first.printed).toContain(`Splitfield at ${first.baseUrl}`);

    const second = await startOnce();
    expect(second.printed).not.toContain('applied');
    expect(second.printed).not.toContain('demo accounts');
  }, 400_000);
});
