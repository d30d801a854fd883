// Samples that share stored tables. The same file processed with the same settings gives the same tables, so a
// second study's sample of it can use the first one's folder under storage/samples/ instead of processing the
// file again: its row names that folder in `tablesId` and has its own copy of the cached planes. A folder stays
// while any done sample uses it, whichever of them is deleted first.
import { Op, type Transaction } from 'sequelize';
import { db } from '@/lib/db/connection';
import type { Sample } from '@/models/sample';
import { removeSampleFiles, type SampleStorage } from './storage';

/** The id whose folder under storage/samples/ holds the sample's tables. */
export function tablesFolderOf(sample: Pick<Sample, 'id' | 'tablesId'>): number {
  return sample.tablesId ?? sample.id;
}

export interface NewSharingSample {
  studyId: number;
  uploadedById: number;
  name: string;
  label: string;
  description: string;
  tags: string[];
  fileName: string;
  uploadMs: number;
}

/** A done sample in another study that uses `source`'s tables: no job, nothing processed again. */
export async function createSharingSample(source: Sample, fields: NewSharingSample, transaction: Transaction): Promise<Sample> {
  const { models } = db();
  const sample = await models.Sample.create(
    {
      ...fields,
      state: 'done',
      settings: source.settings,
      settingsKey: source.settingsKey,
      fileSize: source.fileSize,
      fileHash: source.fileHash,
      uploadFile: null,
      progress: source.progress,
      counts: source.counts,
      input: source.input,
      softwareVersion: source.softwareVersion,
      startedAt: source.startedAt,
      finishedAt: source.finishedAt,
      processingMs: source.processingMs,
      tablesId: tablesFolderOf(source),
    },
    { transaction },
  );
  const planes = await models.SamplePlane.findAll({ where: { sampleId: source.id }, transaction });
  await models.SamplePlane.bulkCreate(
    planes.map((plane) => ({ sampleId: sample.id, horizontal: plane.horizontal, histogram: plane.histogram })),
    { transaction },
  );
  return sample;
}

/** Of these folders, those that no sample uses any more (call inside the transaction that deleted samples). */
export async function unusedTablesFolders(folders: number[], transaction: Transaction): Promise<number[]> {
  if (folders.length === 0) return [];
  const users = await db().models.Sample.findAll({
    where: {
      [Op.or]: [{ tablesId: { [Op.in]: folders } }, { id: { [Op.in]: folders }, tablesId: null }],
    },
    attributes: ['id', 'tablesId'],
    transaction,
  });
  const used = new Set(users.map(tablesFolderOf));
  return [...new Set(folders)].filter((folder) => !used.has(folder));
}

export async function removeTablesFolders(storage: SampleStorage, folders: number[]): Promise<void> {
  for (const folder of folders) await removeSampleFiles(storage, folder);
}
