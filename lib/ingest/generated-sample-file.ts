// Writes a generated sample (lib/physics/emission-generator.ts) as a splitfield-particles JSON Lines file, e.g. the
// demo study's quark-like and gluon-like samples. The file appears under its name only when complete.
import { randomUUID } from 'node:crypto';
import { link, open, rm } from 'node:fs/promises';
import path from 'node:path';
import { generateEmissionRecords, type EmissionSettings } from '../physics/emission-generator';
import { particlesHeaderLine, particlesRecordLine } from './particle-file-writer';

/** What a generated sample says about itself in its file header. */
export interface GeneratedSampleSpec {
  name: string;
  label: string;
  description: string;
  tags: string[];
  /** Free-form facts of the (fictional) scenario, kept by readers as header metadata. */
  scenario: Record<string, string>;
  settings: EmissionSettings;
}

/** The `splitfield-particles` JSON Lines of a generated sample (content "jets"), without newlines. */
export function* particlesFileLines(spec: GeneratedSampleSpec, count: number, seed: number): Generator<string> {
  yield particlesHeaderLine('jets', {
    sample: { name: spec.name, label: spec.label, description: spec.description, tags: spec.tags },
    scenario: spec.scenario,
    generator: { name: 'splitfield emission generator', seed, jets: count, settings: spec.settings },
  });
  for (const record of generateEmissionRecords(spec.settings, count, seed, `${spec.label}-`)) yield particlesRecordLine(record);
}

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
