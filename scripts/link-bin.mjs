// After `npm install`: links the project's own command into node_modules/.bin (npm links the commands of
// dependencies there, not the root package's), so that `node_modules/.bin/splitfield` and `npx splitfield` run it
// without a build step or npm's start-up. `npm link` puts it on PATH for the whole machine.
import { mkdirSync, rmSync, symlinkSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const binDir = path.join(root, 'node_modules/.bin');
const link = path.join(binDir, 'splitfield');
mkdirSync(binDir, { recursive: true });
rmSync(link, { force: true });
symlinkSync(path.relative(binDir, path.join(root, 'bin/splitfield.mjs')), link);
