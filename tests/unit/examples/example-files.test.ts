// The example input files in public/examples/: exactly what the project's generators make (so they can be
// remade with `npm run examples`), processed by the command README gives for each, and the dijet events give the
// same declusterings whether read as splitfield-particles or as HepMC3.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { exampleFileBytes } from '@/lib/demo/example-bytes';
import { EXAMPLE_FILES } from '@/lib/demo/example-files';

const ROOT = path.resolve(__dirname, '../../..');
const EXAMPLES = path.join(ROOT, 'public/examples');
const work = mkdtempSync(path.join(tmpdir(), 'sf-examples-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

/** Runs an example's README command (`splitfield decluster FILE …`) with the file from public/examples/. */
function runCommand(command: string) {
  const [program, sub, file, ...rest] = command.split(' ');
  expect([program, sub]).toEqual(['splitfield', 'decluster']);
  const args = rest.map((arg) => (arg.endsWith('.jsonl') && !arg.startsWith('-') ? path.join(work, arg) : arg));
  const run = spawnSync(path.join(ROOT, 'node_modules/.bin/splitfield'), [sub, path.join(EXAMPLES, file), '--threads', '1', ...args], { encoding: 'utf8' });
  expect(run.stderr).not.toMatch(/error/);
  expect(run.status).toBe(0);
  const out = rest[rest.indexOf('--out') + 1];
  return readFileSync(path.join(work, out), 'utf8').trim().split('\n').map((line) => JSON.parse(line));
}

describe('example input files', () => {
  it.each(EXAMPLE_FILES.map((file) => [file.name, file] as const))('%s is what the generator makes', (_name, file) => {
    expect(readFileSync(path.join(EXAMPLES, file.name)).equals(exampleFileBytes(file))).toBe(true);
  });

  it('the jets file gives one jet a record with its splittings', () => {
    const [header, ...jets] = runCommand(EXAMPLE_FILES[0].command);
    expect(header).toMatchObject({ format: 'splitfield-declusterings', content: 'jets' });
    expect(jets).toHaveLength(300);
    expect(jets.reduce((sum, jet) => sum + jet.primary.length, 0)).toBeGreaterThan(300);
  });

  it('the dijet events give the same declusterings as JSON Lines and as HepMC3', () => {
    const [, ...fromJson] = runCommand(EXAMPLE_FILES[1].command);
    const [, ...fromHepMC3] = runCommand(EXAMPLE_FILES[2].command);
    expect(fromJson.length).toBeGreaterThan(200);
    expect(fromHepMC3.map((jet) => ({ ...jet, rec: `ev${jet.rec}` }))).toEqual(fromJson);
  });

  it('README names every example file with its command', () => {
    const readme = readFileSync(path.join(ROOT, 'README.md'), 'utf8');
    for (const file of EXAMPLE_FILES) {
      expect(readme).toContain(`public/examples/${file.name}`);
      expect(readme).toContain(file.command);
    }
  });
});
