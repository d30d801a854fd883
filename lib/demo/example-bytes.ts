// The bytes of an example file as stored in public/examples/: its lines, gzip-compressed for names ending in .gz
// (zlib's output is the same for the same input, so the stored files can be checked byte for byte).
import { gzipSync } from 'node:zlib';
import type { ExampleFile } from './example-files';

export function exampleFileBytes(file: ExampleFile): Buffer {
  const text = Buffer.from(`${[...file.lines()].join('\n')}\n`);
  return file.name.endsWith('.gz') ? gzipSync(text, { level: 9 }) : text;
}
