// A real Splitfield server for tests: the built app under `next start`, on a free local port, with its own
// temporary storage and database, prepared exactly as `npm start` prepares them. Plus a cookie-keeping client
// that signs in through next-auth's credentials form.
import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { createRequire } from 'node:module';
import { createServer } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { readConfig } from '@/lib/config/environment';
import type { DemoAccount } from '@/lib/demo/seed';
import { prepareStorage } from '@/scripts/prepare-storage';

const repoRoot = path.resolve(__dirname, '..', '..');
const READY_TIMEOUT_MS = 60_000;

export interface TestServer {
  baseUrl: string;
  storageDir: string;
  databasePath: string;
  /** The demo accounts the first start made: the site admin and the two members. */
  credentials: { admin: DemoAccount; members: DemoAccount[] };
  /** Process id of the server (`next start`), e.g. to read its memory use. */
  pid: number;
  /** What the server printed so far, for failure messages. */
  output(): string;
  /** Stops the server and removes its storage. */
  stop(): Promise<void>;
  /** Kills the server at once (SIGKILL) and keeps its storage, for a restart with `storageOf`. */
  kill(): Promise<void>;
}

export interface TestServerOptions {
  /** The build to serve; defaults to $NEXT_DIST_DIR, else `.next` (what `npm run build` makes). */
  distDir?: string;
  env?: Record<string, string>;
  /** Serve the storage (and so the accounts) of this server, which must have been killed, instead of a fresh one. */
  storageOf?: TestServer;
  /** Jets of each demo sample the first start makes; tests that do not look at them keep them few. Default 2000. */
  demoJets?: number;
}

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address();
      probe.close(() => (typeof address === 'object' && address ? resolve(address.port) : reject(new Error('no port'))));
    });
  });
}

async function waitUntilReady(baseUrl: string, exited: () => boolean, output: () => string): Promise<void> {
  const deadline = Date.now() + READY_TIMEOUT_MS;
  while (Date.now() < deadline) {
    if (exited()) throw new Error(`The test server exited while starting:\n${output()}`);
    try {
      const response = await fetch(`${baseUrl}/api/auth/csrf`);
      if (response.ok) return;
    } catch {
      // Not listening yet.
    }
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  throw new Error(`The test server did not answer within ${READY_TIMEOUT_MS} ms:\n${output()}`);
}

export async function startTestServer(options: TestServerOptions = {}): Promise<TestServer> {
  const distDir = path.resolve(repoRoot, options.distDir ?? process.env.NEXT_DIST_DIR ?? '.next');
  if (!existsSync(path.join(distDir, 'BUILD_ID'))) {
    throw new Error(`No build in ${distDir}: run "npm run build" first (with the same NEXT_DIST_DIR).`);
  }
  const storageDir = options.storageOf?.storageDir ?? mkdtempSync(path.join(os.tmpdir(), 'splitfield-test-'));
  const config = readConfig({ SPLITFIELD_STORAGE: storageDir });
  const prepared = await prepareStorage(config, { SPLITFIELD_DEMO_JETS: String(options.demoJets ?? 2000) });
  const earlier = options.storageOf?.credentials;
  const accounts = prepared.demoAccounts ?? (earlier ? [earlier.admin, ...earlier.members] : []);
  const admin = accounts.find((account) => account.siteRole === 'admin');
  if (!admin) throw new Error('The seed made no admin account.');

  const port = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;
  const nextBin = createRequire(__filename).resolve('next/dist/bin/next');
  const child = spawn(process.execPath, [nextBin, 'start', '-H', '127.0.0.1', '-p', String(port)], {
    cwd: repoRoot,
    env: {
      ...process.env,
      NEXT_TELEMETRY_DISABLED: '1',
      NEXT_DIST_DIR: path.relative(repoRoot, distDir),
      SPLITFIELD_STORAGE: storageDir,
      SPLITFIELD_DB: config.databasePath,
      NEXTAUTH_SECRET: prepared.secret,
      NEXTAUTH_URL: baseUrl,
      // The test fixtures make many accounts from one address; tests of the sign-up limit set it back ('').
      SPLITFIELD_SIGNUPS_PER_ADDRESS: '10000',
      ...options.env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let printed = '';
  child.stdout.on('data', (chunk) => (printed += chunk));
  child.stderr.on('data', (chunk) => (printed += chunk));
  let exited = false;
  const exit = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  void exit.then(() => (exited = true));

  const stop = async () => {
    if (!exited) {
      child.kill('SIGTERM');
      const forced = setTimeout(() => child.kill('SIGKILL'), 10_000);
      await exit;
      clearTimeout(forced);
    }
    rmSync(storageDir, { recursive: true, force: true });
  };
  const kill = async () => {
    if (!exited) child.kill('SIGKILL');
    await exit;
  };
  try {
    await waitUntilReady(baseUrl, () => exited, () => printed);
  } catch (error) {
    await stop();
    throw error;
  }
  return {
    baseUrl,
    storageDir,
    databasePath: config.databasePath,
    credentials: { admin, members: accounts.filter((account) => account !== admin) },
    pid: child.pid!,
    output: () => printed,
    stop,
    kill,
  };
}

export interface ApiResponse<T = any> {
  status: number;
  headers: Headers;
  /** The parsed JSON body; null when the body is empty or not JSON. */
  body: T;
  text: string;
}

/** A browser-like client: keeps the cookies the server sets and sends them back. */
export class Client {
  private readonly cookies = new Map<string, string>();

  constructor(readonly baseUrl: string) {}

  /** The cookies held, e.g. to hand a signed-in session to a browser context. */
  cookieList(): { name: string; value: string }[] {
    return [...this.cookies].map(([name, value]) => ({ name, value }));
  }

  /**
   * Sends `body` as JSON, `rawBody` as it is (with a JSON content type), `form` URL-encoded, `multipart` as
   * multipart/form-data, or `stream` as it is produced (with its own content type); `headers` are added (e.g. an
   * Authorization header).
   */
  async send(
    method: string,
    pathname: string,
    options: {
      body?: unknown;
      rawBody?: string;
      form?: Record<string, string>;
      multipart?: FormData;
      stream?: { body: ReadableStream<Uint8Array>; contentType: string };
      headers?: Record<string, string>;
    } = {},
  ): Promise<ApiResponse> {
    const headers: Record<string, string> = { ...options.headers };
    if (this.cookies.size > 0) headers.cookie = [...this.cookies].map(([name, value]) => `${name}=${value}`).join('; ');
    let payload: string | FormData | ReadableStream<Uint8Array> | undefined;
    if (options.multipart) {
      payload = options.multipart;
    } else if (options.stream) {
      headers['content-type'] = options.stream.contentType;
      payload = options.stream.body;
    } else if (options.form) {
      headers['content-type'] = 'application/x-www-form-urlencoded';
      payload = new URLSearchParams(options.form).toString();
    } else if (options.rawBody !== undefined || options.body !== undefined) {
      headers['content-type'] ??= 'application/json';
      payload = options.rawBody ?? JSON.stringify(options.body);
    }
    // A streamed body needs half duplex (undici sends it while the response may already start).
    const duplex = options.stream ? { duplex: 'half' } : {};
    const response = await fetch(new URL(pathname, this.baseUrl), { method, headers, body: payload, redirect: 'manual', ...duplex } as RequestInit);
    this.keepCookies(response.headers);
    const text = await response.text();
    let body = null;
    try {
      body = text ? JSON.parse(text) : null;
    } catch {
      // Not JSON (a page, a redirect): callers read `text`.
    }
    return { status: response.status, headers: response.headers, body, text };
  }

  get(pathname: string) {
    return this.send('GET', pathname);
  }
  post(pathname: string, body?: unknown) {
    return this.send('POST', pathname, { body });
  }
  patch(pathname: string, body?: unknown) {
    return this.send('PATCH', pathname, { body });
  }
  delete(pathname: string) {
    return this.send('DELETE', pathname);
  }

  private keepCookies(headers: Headers): void {
    for (const line of headers.getSetCookie()) {
      const [pair, ...attributes] = line.split(';');
      const separator = pair.indexOf('=');
      const name = pair.slice(0, separator).trim();
      const value = pair.slice(separator + 1).trim();
      const expired = attributes.some((attribute) => /^\s*max-age=0\s*$/i.test(attribute)) || value === '';
      if (expired) this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
  }
}

/**
 * Signs in with e-mail and password through next-auth's credentials form (csrf token included).
 * Returns the response of the sign-in post; on success (status 200) the client holds the session cookie.
 */
export async function postSignIn(client: Client, email: string, password: string): Promise<ApiResponse> {
  const csrf = await client.get('/api/auth/csrf');
  return client.send('POST', '/api/auth/callback/credentials', {
    form: { csrfToken: csrf.body.csrfToken, email, password, json: 'true', callbackUrl: client.baseUrl },
  });
}

/** A client signed in as this user; throws when the server refuses. */
export async function signIn(baseUrl: string, email: string, password: string): Promise<Client> {
  const client = new Client(baseUrl);
  const response = await postSignIn(client, email, password);
  if (response.status !== 200) throw new Error(`Sign-in of ${email} failed: ${response.status} ${response.text}`);
  return client;
}
