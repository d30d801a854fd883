// A Separation of two done samples on one plane view: the training halves' density maps and their ln-ratio table,
// the Poisson emission score of every evaluation jet, its ROC against the single-variable taggers on the same jets,
// the score distributions, and the region proposals. Results are cached by samples and settings like the maps'.
import { type BinnedPlane, densityOf, fillPlane, type PlaneBins } from '@/lib/physics/plane/binned-plane';
import { packed, scoreJets, scoreTable } from '@/lib/physics/separation/emission-score';
import { logRatioTable } from '@/lib/physics/separation/log-ratio';
import { rankScores } from '@/lib/physics/separation/ranked-scores';
import { findRegions } from '@/lib/physics/separation/region-finder';
import { type Roc, rocOf } from '@/lib/physics/separation/roc';
import { scoreDistribution } from '@/lib/physics/separation/score-distribution';
import { SPLIT_RULE, splitJets } from '@/lib/physics/separation/split';
import { variableTagger } from '@/lib/physics/separation/variable-taggers';
import { checkedSamples, finiteOrNull, remembered, sharedBins, withFilterField } from '@/lib/maps/compute';
import { membersAndCoordinates, sampleColumns, viewJets } from '@/lib/maps/plane-source';
import { requireJets } from '@/lib/maps/resolve-bins';
import { sampleKey } from '@/lib/maps/sample-key';
import { sampleRef } from '@/lib/maps/sample-ref';
import { planeViewKey, type PlaneView } from '@/lib/maps/view-settings';
import type { Sample } from '@/models/sample';
import type { RocView, SeparationResult, SeparationSide } from './shapes';

/** The jet-table columns compared with the plane score, and how the page names them. */
export const VARIABLE_TAGGERS = [
  { name: 'multiplicity', label: 'primary multiplicity (kₜ above the cut)' },
  { name: 'mg', label: 'groomed mass m_g' },
  { name: 'zg', label: 'z_g' },
  { name: 'Rg', label: 'R_g' },
  { name: 'm', label: 'jet mass' },
  { name: 'n', label: 'constituent count' },
] as const;

export const REGION_MEASURE = 'per-bin contribution to the symmetric χ² distance, (ρ_S − ρ_B)²/(ρ_S + ρ_B) · bin area';
const MAX_PROPOSALS = 5;

export function rocView(roc: Roc): RocView {
  return { ...roc, curve: roc.curve.map((p) => ({ ...p, threshold: finiteOrNull(p.threshold) })) };
}

/** One sample's selection, split, training plane and columns. */
async function separationSide(sample: Sample, view: PlaneView, bins: PlaneBins, role: string) {
  const data = sampleColumns(sample);
  const [jets, record, columns] = await Promise.all([viewJets(sample, view), data.jet('record'), membersAndCoordinates(sample, view)]);
  const split = splitJets(record, jets.selected);
  const plane: BinnedPlane = fillPlane(bins, { ...columns, selected: split.train });
  requireJets(plane.jetWeight, `the training half of the ${role} sample ${sample.id} ("${sample.name}")`);
  requireJets(split.evaluateCount, `the evaluation half of the ${role} sample ${sample.id} ("${sample.name}")`);
  const shown: SeparationSide = {
    sample: sampleRef(sample),
    jets: { stored: jets.stored, selected: jets.count, weight: jets.weight, rejected: jets.rejected, medianPt: finiteOrNull(jets.medianPt) },
    trainJets: split.trainCount,
    evaluateJets: split.evaluateCount,
  };
  return { sample, data, split, columns, grid: densityOf(plane), shown };
}

type Side = Awaited<ReturnType<typeof separationSide>>;

/** The single-variable taggers depend on the selection (and so the split) only: kept by samples and selection. */
function variableTaggers(signal: Side, background: Side, selection: PlaneView['selection']) {
  const key = `separation-variables:${sampleKey(signal.sample)},${sampleKey(background.sample)}:${JSON.stringify(selection)}`;
  return remembered(key, () => computeVariableTaggers(signal, background));
}

async function computeVariableTaggers(signal: Side, background: Side) {
  const out = [];
  for (const { name, label } of VARIABLE_TAGGERS) {
    const side = async (s: Side) => ({ values: await s.data.jet(name), weights: s.columns.jetWeight, train: s.split.train, evaluate: s.split.evaluate });
    const tagger = variableTagger(await side(signal), await side(background));
    out.push({ name, label, largerIsSignal: tagger.largerIsSignal, roc: rocView(tagger.roc) });
  }
  return out;
}

export function computeSeparation(signal: Sample, background: Sample, view: PlaneView, minEntries: number): Promise<SeparationResult> {
  checkedSamples([signal, background], view);
  const key = `separation:${sampleKey(signal)},${sampleKey(background)}:${minEntries}:${planeViewKey(view)}`;
  return remembered(key, () =>
    withFilterField(async () => {
      const bins = await sharedBins([signal, background], view);
      const s = await separationSide(signal, view, bins, 'signal');
      const b = await separationSide(background, view, bins, 'background');
      const table = logRatioTable(s.grid, b.grid, minEntries);
      const scoring = scoreTable(bins, table.value, table.masked, table.excessPerJet);
      const ranked = (side: Side) => rankScores(scoreJets(scoring, { ...side.columns, jets: side.split.evaluate }), packed(side.columns.jetWeight, side.split.evaluate));
      const rankedS = ranked(s);
      const rankedB = ranked(b);
      return {
        view,
        bins,
        minEntries,
        splitRule: SPLIT_RULE,
        signal: s.shown,
        background: b.shown,
        logRatio: {
          value: Array.from(table.value, finiteOrNull),
          error: Array.from(table.error, finiteOrNull),
          masked: Array.from(table.masked),
          excessPerJet: table.excessPerJet,
        },
        score: { roc: rocView(rocOf(rankedS, rankedB)), distribution: scoreDistribution([rankedS, rankedB]) },
        variables: await variableTaggers(s, b, view.selection),
        regions: { measure: REGION_MEASURE, proposals: findRegions(s.grid, b.grid, table.masked, MAX_PROPOSALS) },
      };
    }),
  );
}
