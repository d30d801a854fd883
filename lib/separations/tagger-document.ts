// The tagger file, `splitfield-tagger` version 1 (README "Separations and taggers"): everything needed to score a
// jet in one self-describing JSON document — the plane's variables and tree, the bins, the jet selection, the
// ln(ρ_S/ρ_B) table (rows of the vertical coordinate, each a list over the horizontal one; null where masked), the
// constant −∫(ρ_S − ρ_B), the working points chosen on the training pair and the training samples' file hashes.
// A saved tagger is stored as this document, exported as it is, and an imported file is checked against it.
import { z } from 'zod';
import { HORIZONTAL_VARIABLES, TREE_CHOICES, VERTICAL_VARIABLES } from '@/lib/physics/plane/axes';
import { axisBins, MAX_BINS_PER_AXIS } from '@/lib/physics/plane/bins';
import type { PlaneBins } from '@/lib/physics/plane/binned-plane';
import type { ScoreTable } from '@/lib/physics/separation/emission-score';
import { plainName } from '@/lib/api/schemas';
import { selectionSchema } from '@/lib/maps/view-settings';
import { ENTRY_TITLE_MAX } from '@/models/vocabulary';

export const TAGGER_FORMAT = 'splitfield-tagger';
export const TAGGER_VERSION = 1;

export const SCORE_RULE =
  'score = offset + the sum, over the jet’s splittings of the given tree whose (x, y) falls in a bin with a number, of lnRatio[iy][ix], where ix = floor((x - bins.x.min) / bins.x.step) and iy = floor((y - bins.y.min) / bins.y.step) (a value exactly at max belongs to the last bin); splittings outside the bins or in a null bin add nothing. Larger scores are more signal-like; a jet passes a working point when its score is at least the threshold.';

const finite = (what: string) => z.number({ error: `${what} must be a number` }).refine(Number.isFinite, `${what} must be finite`);
const axisBinsSchema = (name: string) =>
  z.strictObject({ min: finite(`${name}.min`), max: finite(`${name}.max`), step: finite(`${name}.step`), count: z.number().int().min(1).max(MAX_BINS_PER_AXIS) });
const sampleSchema = z.strictObject({
  name: z.string().max(ENTRY_TITLE_MAX),
  label: z.string().max(ENTRY_TITLE_MAX),
  fileHash: z.string().regex(/^[0-9a-f]{64}$/, 'fileHash must be a SHA-256 in hexadecimal'),
});

export const taggerDocumentSchema = z
  .strictObject({
    format: z.literal(TAGGER_FORMAT, { error: `format must be "${TAGGER_FORMAT}"` }),
    version: z.literal(TAGGER_VERSION, { error: `version must be ${TAGGER_VERSION}` }),
    name: plainName(z.string({ error: 'name must be text' }).trim().min(1, 'name must not be empty').max(ENTRY_TITLE_MAX), 'name'),
    score: z.string().max(2000),
    plane: z.strictObject({
      tree: z.enum(TREE_CHOICES),
      x: z.strictObject({ variable: z.enum(HORIZONTAL_VARIABLES), log: z.boolean() }),
      y: z.strictObject({ variable: z.enum(VERTICAL_VARIABLES), log: z.boolean() }),
    }),
    bins: z.strictObject({ x: axisBinsSchema('bins.x'), y: axisBinsSchema('bins.y') }),
    selection: selectionSchema,
    lnRatio: z.array(z.array(finite('lnRatio entry').nullable()).max(MAX_BINS_PER_AXIS)).max(MAX_BINS_PER_AXIS),
    offset: finite('offset'),
    workingPoints: z
      .array(z.strictObject({ signalEfficiency: z.number().min(0).max(1), threshold: finite('threshold'), backgroundEfficiency: z.number().min(0).max(1) }))
      .max(20),
    training: z.strictObject({
      signal: sampleSchema,
      background: sampleSchema,
      split: z.string().max(1000),
      minEntries: z.number().int().min(0),
      auc: z.number().min(0).max(1),
      aucError: z.number().min(0),
    }),
    software: z.string().max(100),
    createdAt: z.string().max(40),
  })
  .superRefine((doc, context) => {
    for (const axis of ['x', 'y'] as const) {
      const b = doc.bins[axis];
      try {
        if (axisBins(b.min, b.max, b.step, `bins.${axis}`).count !== b.count) throw new RangeError(`bins.${axis}.count must be (max − min)/step`);
      } catch (error) {
        context.addIssue({ code: 'custom', path: ['bins', axis], message: (error as Error).message });
      }
    }
    if (doc.lnRatio.length !== doc.bins.y.count) context.addIssue({ code: 'custom', path: ['lnRatio'], message: `lnRatio must have bins.y.count = ${doc.bins.y.count} rows` });
    doc.lnRatio.forEach((row, iy) => {
      if (row.length !== doc.bins.x.count) context.addIssue({ code: 'custom', path: ['lnRatio', iy], message: `row ${iy} must have bins.x.count = ${doc.bins.x.count} numbers or nulls` });
    });
  });

export type TaggerDocument = z.output<typeof taggerDocumentSchema>;

/** The document's table as the scorer reads it (scoreJets in lib/physics/separation/emission-score.ts). */
export function documentScoreTable(doc: TaggerDocument): ScoreTable {
  const bins: PlaneBins = { x: axisBins(doc.bins.x.min, doc.bins.x.max, doc.bins.x.step), y: axisBins(doc.bins.y.min, doc.bins.y.max, doc.bins.y.step) };
  const term = new Float64Array(bins.x.count * bins.y.count);
  doc.lnRatio.forEach((row, iy) => row.forEach((v, ix) => (term[iy * bins.x.count + ix] = v ?? 0)));
  return { bins, term, offset: doc.offset };
}
