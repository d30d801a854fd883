// `npm start`: prepares storage (folder, session secret, schema migrations, demo data on first start),
// builds the app when no build exists or it is older than the sources, then serves it on HOST:PORT.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { tsImport } from 'tsx/esm/api';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
process.chdir(root);

// What a build is made from: when any of it is newer than the build, the build is stale.
const BUILD_SOURCES = [
  'app',
  'components',
  'lib',
  'models',
  'public',
  'proxy.ts',
  'next.config.mjs',
  'package-lock.json',
  'tailwind.config.ts',
  'postcss.config.mjs',
  'tsconfig.json',
];

function newestChange(file) {
  if (!existsSync(file)) return 0;
  const stats = statSync(file);
  if (!stats.isDirectory()) return stats.mtimeMs;
  return Math.max(stats.mtimeMs, ...readdirSync(file).map((name) => newestChange(path.join(file, name))));
}

function buildIsCurrent(distDir) {
  const buildId = path.join(distDir, 'BUILD_ID');
  if (!existsSync(buildId)) return false;
  const builtAt = statSync(buildId).mtimeMs;
  return BUILD_SOURCES.every((source) => newestChange(source) <= builtAt);
}

/** The address people use in a browser; a wildcard listen address is reached as localhost. */
function publicUrl(host, port) {
  const name = host === '0.0.0.0' || host === '::' ? 'localhost' : host.includes(':') ? `[${host}]` : host;
  return `http://${name}:${port}`;
}

const { readConfig } = await tsImport('../lib/config/environment.ts', import.meta.url);
const { prepareStorage } = await tsImport('./prepare-storage.ts', import.meta.url);
const { demoCredentialsText, DEMO_CREDENTIALS_FILE } = await tsImport('../lib/demo/seed.ts', import.meta.url);

const config = readConfig();
const prepared = await prepareStorage(config);
if (prepared.appliedMigrations.length > 0) {
  console.log(`Database ${config.databasePath}: applied ${prepared.appliedMigrations.join(', ')}`);
}
if (prepared.demoAccounts) {
  console.log(`\n${demoCredentialsText(prepared.demoAccounts)}`);
  console.log(`(Also written to ${path.join(config.storageDir, DEMO_CREDENTIALS_FILE)}; shown only this once.)\n`);
}

const env = {
  ...process.env,
  NEXT_TELEMETRY_DISABLED: '1',
  NEXTAUTH_SECRET: prepared.secret,
  NEXTAUTH_URL: process.env.NEXTAUTH_URL || publicUrl(config.host, config.port),
  SPLITFIELD_STORAGE: config.storageDir,
  SPLITFIELD_DB: config.databasePath,
};

const distDir = process.env.NEXT_DIST_DIR || '.next';
if (!buildIsCurrent(distDir)) {
  console.log(`Building the app into ${distDir} (no build yet, or sources changed since)...`);
  const build = spawnSync('npm', ['run', 'build'], { stdio: 'inherit', env });
  if (build.status !== 0) process.exit(build.status ?? 1);
}

const nextBin = createRequire(import.meta.url).resolve('next/dist/bin/next');
const server = spawn(process.execPath, [nextBin, 'start', '-H', config.host, '-p', String(config.port)], {
  stdio: 'inherit',
  env,
});
console.log(`Splitfield at ${env.NEXTAUTH_URL}`);
for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => server.kill(signal));
server.on('exit', (code, signal) => process.exit(code ?? (signal ? 1 : 0)));
