// The installed `splitfield` command (bin/splitfield.mjs): subcommands, and building the engine bundle only when
// it is missing or older than its sources. Run on a copy of the project's sources in a temporary folder, so that
// touching a source does not disturb other tests.
import { spawnSync } from 'node:child_process';
import { cpSync, existsSync, lstatSync, mkdirSync, readlinkSync, rmSync, statSync, symlinkSync, utimesSync } from 'node:fs';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';

const ROOT = path.resolve(__dirname, '../../..');
const COPY = path.join(ROOT, 'tests/artifacts', `bin-${process.pid}`);

function copyProject(): void {
  mkdirSync(COPY, { recursive: true });
  for (const item of ['bin', 'lib', 'models', 'scripts', 'package.json', 'package-lock.json', 'tsconfig.json']) {
    cpSync(path.join(ROOT, item), path.join(COPY, item), { recursive: true });
  }
  symlinkSync(path.join(ROOT, 'node_modules'), path.join(COPY, 'node_modules'));
}

function splitfield(...args: string[]) {
  const r = spawnSync(process.execPath, [path.join(COPY, 'bin/splitfield.mjs'), ...args], { encoding: 'utf8' });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

afterAll(() => rmSync(COPY, { recursive: true, force: true }));

describe('splitfield command', () => {
  it('is linked into node_modules/.bin by npm install', () => {
    const link = path.join(ROOT, 'node_modules/.bin/splitfield');
    expect(lstatSync(link).isSymbolicLink()).toBe(true);
    expect(path.resolve(path.dirname(link), readlinkSync(link))).toBe(path.join(ROOT, 'bin/splitfield.mjs'));
  });

  it('builds the bundle when it is missing or stale, and only then', () => {
    copyProject();
    const bundle = path.join(COPY, 'dist/engine/cli.js');
    expect(existsSync(bundle)).toBe(false);
    const first = splitfield('decluster', '--version');
    expect([first.code, first.out]).toEqual([0, expect.stringMatching(/^splitfield \d+\.\d+\.\d+\n$/)]);
    const built = statSync(bundle).mtimeMs;

    expect(splitfield('decluster', '--version').code).toBe(0);
    expect(statSync(bundle).mtimeMs).toBe(built);

    // A source newer than the bundle: the next run builds again.
    const source = path.join(COPY, 'lib/physics/decluster.ts');
    const later = new Date(built + 5000);
    utimesSync(source, later, later);
    expect(splitfield('decluster', '--version').code).toBe(0);
    expect(statSync(bundle).mtimeMs).toBeGreaterThan(built);
  });

  it('lists its commands, and refuses an unknown one with exit code 2', () => {
    const help = splitfield('--help');
    expect([help.code, help.out]).toEqual([0, expect.stringContaining('decluster')]);
    const none = splitfield();
    expect([none.code, none.out]).toEqual([2, expect.stringContaining('Usage: splitfield COMMAND')]);
    const bad = splitfield('cluster');
    expect([bad.code, bad.err]).toEqual([2, expect.stringContaining('splitfield: unknown command "cluster"')]);
  });

  it('decluster --help lists the options with their defaults and the exit codes', () => {
    const r = splitfield('decluster', '--help');
    expect(r.code).toBe(0);
    for (const text of ['--algorithm antikt|kt|ca', 'default antikt', '--zcut 0.1', '--threads N', 'Exit codes: 0 done']) {
      expect(r.out).toContain(text);
    }
  });
});
