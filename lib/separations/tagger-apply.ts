// A saved tagger applied to any done sample the user can see: every jet of the tagger's selection is scored with its
// table (the same scorer as the Separation's evaluation jets), giving the score distribution, the efficiency at the
// working points chosen on the training pair, and, on request, each jet's score.
import { packed, scoreJets } from '@/lib/physics/separation/emission-score';
import { rankScores } from '@/lib/physics/separation/ranked-scores';
import { efficiencyAt } from '@/lib/physics/separation/roc';
import { type ScoreDistribution, scoreDistribution } from '@/lib/physics/separation/score-distribution';
import { checkedSamples, finiteOrNull, withFilterField } from '@/lib/maps/compute';
import { membersAndCoordinates, sampleColumns, viewJets } from '@/lib/maps/plane-source';
import { requireJets } from '@/lib/maps/resolve-bins';
import { sampleRef } from '@/lib/maps/sample-ref';
import type { JetCounts, SampleRef } from '@/lib/maps/shapes';
import { planeViewSchema, type PlaneView } from '@/lib/maps/view-settings';
import type { Sample } from '@/models/sample';
import { documentScoreTable, type TaggerDocument } from './tagger-document';

export interface TaggerApplication {
  sample: SampleRef;
  jets: JetCounts;
  meanScore: number;
  distribution: ScoreDistribution;
  workingPoints: Array<{ signalEfficiency: number; trainingBackgroundEfficiency: number; threshold: number; efficiency: number; error: number }>;
}

function documentView(doc: TaggerDocument): PlaneView {
  const range = (axis: 'x' | 'y') => ({ min: doc.bins[axis].min, max: doc.bins[axis].max, step: doc.bins[axis].step });
  return planeViewSchema.parse({ tree: doc.plane.tree, x: doc.plane.x, y: doc.plane.y, bins: { x: range('x'), y: range('y') }, selection: doc.selection });
}

/** Scores of the sample's selected jets, in jet-table order, and which jets they are. */
export async function taggerScores(doc: TaggerDocument, sample: Sample) {
  const view = documentView(doc);
  checkedSamples([sample], view);
  return withFilterField(async () => {
    const [jets, columns] = await Promise.all([viewJets(sample, view), membersAndCoordinates(sample, view)]);
    requireJets(jets.weight, `sample ${sample.id} ("${sample.name}") with the tagger's jet selection`);
    const scores = scoreJets(documentScoreTable(doc), { ...columns, jets: jets.selected });
    return { jets, scores, weights: packed(columns.jetWeight, jets.selected) };
  });
}

export async function applyTagger(doc: TaggerDocument, sample: Sample): Promise<TaggerApplication> {
  const { jets, scores, weights } = await taggerScores(doc, sample);
  const ranked = rankScores(scores, weights);
  let mean = 0;
  for (let i = 0; i < ranked.score.length; i++) mean += ranked.weight[i] * ranked.score[i];
  return {
    sample: sampleRef(sample),
    jets: { stored: jets.stored, selected: jets.count, weight: jets.weight, rejected: jets.rejected, medianPt: finiteOrNull(jets.medianPt) },
    meanScore: mean / ranked.total,
    distribution: scoreDistribution([ranked]),
    workingPoints: doc.workingPoints.map((w) => ({
      signalEfficiency: w.signalEfficiency,
      trainingBackgroundEfficiency: w.backgroundEfficiency,
      threshold: w.threshold,
      ...efficiencyAt(ranked, w.threshold),
    })),
  };
}

/** Each selected jet's score as JSON Lines: {"rec": record id, "jet": index in its record, "score": …}. */
export async function jetScoreLines(doc: TaggerDocument, sample: Sample): Promise<string> {
  const { jets, scores } = await taggerScores(doc, sample);
  const data = sampleColumns(sample);
  const [record, jet] = await Promise.all([data.jet('record'), data.jet('jet')]);
  const ids = await data.recordIds();
  const lines: string[] = [];
  let k = 0;
  for (let j = 0; j < jets.selected.length; j++) {
    if (jets.selected[j]) lines.push(JSON.stringify({ rec: ids[record[j]], jet: jet[j], score: scores[k++] }));
  }
  return `${lines.join('\n')}\n`;
}
