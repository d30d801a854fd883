// Writes the example input files of lib/demo/example-files.ts into public/examples/ (gzip for names ending .gz).
// The files are committed; a unit test checks that they are exactly what this script makes.
//   npm run examples
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { exampleFileBytes } from '../lib/demo/example-bytes';
import { EXAMPLE_FILES } from '../lib/demo/example-files';

const dir = path.resolve(__dirname, '../public/examples');
mkdirSync(dir, { recursive: true });
for (const file of EXAMPLE_FILES) {
  const bytes = exampleFileBytes(file);
  writeFileSync(path.join(dir, file.name), bytes);
  process.stdout.write(`public/examples/${file.name}: ${(bytes.length / 1024).toFixed(0)} kB\n`);
}
