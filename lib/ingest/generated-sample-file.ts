// Writes a generated sample (lib/physics/emission-generator.ts) as a splitfield-particles JSON Lines file, e.g. the
// demo study's quark-like and gluon-like samples. The file appears under its name only when complete.
import { randomUUID } from 'node:crypto';
import { link, open, rm } from 'node:fs/promises';
import path from 'node:path';
import { type GeneratedSampleSpec, particlesFileLines } from '../physics/emission-generator';

/** Text is handed to the file in pieces of about this many characters, so memory stays bounded. */
const WRITE_CHUNK_CHARS = 1 << 20;

/** Writes `count` jets of `spec` from `seed` to `file` (JSON Lines, not compressed); fails if `file` exists. */
export async function writeGeneratedSampleFile(file: string, spec: GeneratedSampleSpec, count: number, seed: number): Promise<void> {
  const partial = path.join(path.dirname(file), `.${path.basename(file)}.partial-${randomUUID()}`);
  const handle = await open(partial, 'wx');
  try {
    let pending: string[] = [];
    let pendingChars = 0;
    for (const line of particlesFileLines(spec, count, seed)) {
      pending.push(line, '\n');
      pendingChars += line.length + 1;
      if (pendingChars >= WRITE_CHUNK_CHARS) {
        await handle.write(pending.join(''));
        pending = [];
        pendingChars = 0;
      }
    }
    await handle.write(pending.join(''));
    await handle.sync();
    await handle.close();
    await link(partial, file); // atomic, and unlike rename it refuses to replace an existing file
  } catch (error) {
    await handle.close().catch(() => undefined);
    throw error;
  } finally {
    await rm(partial, { force: true });
  }
}
