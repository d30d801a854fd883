// Saved taggers of a study: made from a Separation entry's result or from an imported file, listed, found, removed.
// A tagger row keeps its document (tagger-document.ts) as JSON text, exactly what it exports.
import type { Transaction } from 'sequelize';
import { badRequest, notFound } from '@/lib/api/errors';
import { authorView } from '@/lib/api/views';
import { db } from '@/lib/db/connection';
import { SOFTWARE_VERSION } from '@/lib/ingest/export';
import { viewSamples } from '@/lib/maps/view-samples';
import type { Tagger } from '@/models/tagger';
import type { User } from '@/models/user';
import { computeSeparation } from './compute';
import { separationSettingsSchema } from './settings';
import type { SeparationResult } from './shapes';
import { SCORE_RULE, TAGGER_FORMAT, TAGGER_VERSION, type TaggerDocument, taggerDocumentSchema } from './tagger-document';

/** The tagger document of a computed Separation. */
export function taggerDocument(result: SeparationResult, name: string, createdAt: Date): TaggerDocument {
  const { x, y } = result.bins;
  const lnRatio = Array.from({ length: y.count }, (_, iy) => result.logRatio.value.slice(iy * x.count, (iy + 1) * x.count));
  const trainingSample = (side: SeparationResult['signal']) => ({ name: side.sample.name, label: side.sample.label, fileHash: side.sample.fileHash });
  const { roc } = result.score;
  return {
    format: TAGGER_FORMAT,
    version: TAGGER_VERSION,
    name,
    score: SCORE_RULE,
    plane: { tree: result.view.tree, x: result.view.x, y: result.view.y },
    bins: { x, y },
    selection: result.view.selection,
    lnRatio,
    offset: -result.logRatio.excessPerJet,
    workingPoints: roc.workingPoints.map((w) => ({ signalEfficiency: w.signalEfficiency, threshold: w.threshold, backgroundEfficiency: w.backgroundEfficiency })),
    training: {
      signal: trainingSample(result.signal),
      background: trainingSample(result.background),
      split: result.splitRule,
      minEntries: result.minEntries,
      auc: roc.auc,
      aucError: roc.aucError,
    },
    software: `splitfield ${SOFTWARE_VERSION}`,
    createdAt: createdAt.toISOString(),
  };
}

/** The document of a Separation entry of the study, computed as its page shows it (400 for another kind). */
export async function separationEntryDocument(user: User, studyId: number, entryId: number, name: string): Promise<TaggerDocument> {
  const entry = await db().models.Entry.findOne({ where: { id: entryId, studyId } });
  if (!entry || entry.kind !== 'separation') {
    throw badRequest(`Invalid request body: entryId: no Separation entry ${entryId} in this study`, [{ path: 'entryId', message: `no Separation entry ${entryId} in this study` }]);
  }
  const settings = separationSettingsSchema.parse(entry.settings);
  const [signal, background] = await viewSamples(user, [settings.signalSampleId, settings.backgroundSampleId]);
  return taggerDocument(await computeSeparation(signal, background, settings.view, settings.minEntries), name, new Date());
}

/** A stored document read back (it was checked when saved). */
export function storedDocument(tagger: Tagger): TaggerDocument {
  return taggerDocumentSchema.parse(JSON.parse(tagger.definition));
}

export function taggerView(tagger: Tagger) {
  const doc = storedDocument(tagger);
  return {
    id: tagger.id,
    studyId: tagger.studyId,
    name: tagger.name,
    sourceEntryId: tagger.sourceEntryId,
    plane: doc.plane,
    bins: doc.bins,
    training: doc.training,
    workingPoints: doc.workingPoints,
    createdBy: authorView(tagger.createdBy ?? null),
    createdAt: tagger.createdAt,
  };
}

export async function studyTaggers(studyId: number) {
  const { Tagger, User } = db().models;
  const rows = await Tagger.findAll({ where: { studyId }, include: [{ model: User, as: 'createdBy' }], order: [['id', 'ASC']] });
  return rows.map(taggerView);
}

/** 404 unless the tagger belongs to the study. */
export async function findTagger(studyId: number, taggerId: number, transaction?: Transaction): Promise<Tagger> {
  const { Tagger, User } = db().models;
  const tagger = await Tagger.findOne({ where: { id: taggerId, studyId }, include: [{ model: User, as: 'createdBy' }], transaction });
  if (!tagger) throw notFound(`No tagger with id ${taggerId} in this study.`);
  return tagger;
}
