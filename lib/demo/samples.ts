// The demo study's two samples, made on the very first start: generated quark-like and gluon-like jet files
// (lib/physics/emission-generator.ts) put in the queue like uploads, so the first start shows real maps.
import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { mkdir, rm } from 'node:fs/promises';
import type { Transaction } from 'sequelize';
import { writeGeneratedSampleFile } from '@/lib/ingest/generated-sample-file';
import { demoSampleSpec } from './scenario';
import type { Parton } from '@/lib/physics/lo-density';
import type { Models } from '@/models';
import { settingsInputSchema, settingsKey } from '../ingest/settings';
import { newUploadFileName, sampleStorage, uploadPath } from '../samples/storage';

export const DEMO_SAMPLE_JETS = 20_000;

/** Jets a demo sample holds: tens of thousands, processed in seconds; SPLITFIELD_DEMO_JETS changes it (tests). */
export function demoSampleJets(env: Record<string, string | undefined>): number {
  const value = Number(env.SPLITFIELD_DEMO_JETS ?? DEMO_SAMPLE_JETS);
  return Number.isInteger(value) && value > 0 ? value : DEMO_SAMPLE_JETS;
}
const DEMO_SAMPLES: Array<{ parton: Parton; seed: number }> = [
  { parton: 'quark', seed: 4101 },
  { parton: 'gluon', seed: 4102 },
];

async function digest(file: string): Promise<{ size: number; sha256: string }> {
  const hash = createHash('sha256');
  let size = 0;
  for await (const chunk of createReadStream(file) as AsyncIterable<Buffer>) {
    hash.update(chunk);
    size += chunk.length;
  }
  return { size, sha256: hash.digest('hex') };
}

export interface SeededSamples {
  /** Sample ids by parton. */
  ids: Record<Parton, number>;
  /** Removes the files again, for when the seed's transaction fails. */
  removeFiles: () => Promise<void>;
}

/** Writes the demo sample files into storage/uploads/ and queues them in the demo study, within the seed's transaction. */
export async function seedDemoSamples(
  models: Models,
  transaction: Transaction,
  where: { storageDir: string; studyId: number; uploaderId: number; jets: number },
): Promise<SeededSamples> {
  const storage = sampleStorage(where.storageDir);
  await mkdir(storage.uploadsDir, { recursive: true });
  const written: string[] = [];
  const removeFiles = async () => {
    await Promise.all(written.map((file) => rm(file, { force: true })));
  };
  const ids = {} as Record<Parton, number>;
  try {
    for (const { parton, seed } of DEMO_SAMPLES) {
      const spec = demoSampleSpec(parton);
      const storedName = newUploadFileName();
      const file = uploadPath(storage, storedName);
      written.push(file);
      await writeGeneratedSampleFile(file, spec, where.jets, seed);
      const { size, sha256 } = await digest(file);
      // The generator's jets have radius R: the jet definition and SoftDrop's R0 follow it.
      const settings = settingsInputSchema.parse({ jet: { R: spec.settings.R } });
      const sample = await models.Sample.create(
        {
          studyId: where.studyId,
          uploadedById: where.uploaderId,
          name: spec.name,
          label: spec.label,
          description: spec.description,
          tags: spec.tags,
          state: 'queued',
          settings,
          settingsKey: settingsKey(settings),
          fileName: `${spec.label}.jsonl`,
          fileSize: size,
          fileHash: sha256,
          uploadFile: storedName,
        },
        { transaction },
      );
      ids[parton] = sample.id;
    }
  } catch (error) {
    await removeFiles();
    throw error;
  }
  return { ids, removeFiles };
}
