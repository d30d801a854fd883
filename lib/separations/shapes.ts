// The JSON the separation route answers (README "Separations and taggers"). Types only, so pages import them.
// Numbers that are undefined (a masked bin's ln-ratio, the threshold above every score) are null in JSON.
import type { AxisBins } from '@/lib/physics/plane/bins';
import type { RegionProposal } from '@/lib/physics/separation/region-finder';
import type { ScoreDistribution } from '@/lib/physics/separation/score-distribution';
import type { WorkingPoint } from '@/lib/physics/separation/roc';
import type { JetCounts, JsonNumber, SampleRef } from '@/lib/maps/shapes';
import type { PlaneView } from '@/lib/maps/view-settings';

export interface RocView {
  auc: number;
  aucError: number;
  curve: Array<{ threshold: JsonNumber; signalEfficiency: number; backgroundEfficiency: number }>;
  workingPoints: WorkingPoint[];
  signalJets: number;
  backgroundJets: number;
}

export interface SeparationSide {
  sample: SampleRef;
  /** The view's jet selection on the whole sample. */
  jets: JetCounts;
  /** Selected jets in each half of the split. */
  trainJets: number;
  evaluateJets: number;
}

/** A per-jet observable of the jet table used alone as a tagger, on the same evaluation jets. */
export interface VariableTaggerView {
  name: string;
  label: string;
  largerIsSignal: boolean;
  roc: RocView;
}

export interface SeparationResult {
  view: PlaneView;
  bins: { x: AxisBins; y: AxisBins };
  minEntries: number;
  /** The train/evaluate rule, in words. */
  splitRule: string;
  signal: SeparationSide;
  background: SeparationSide;
  /** ln(ρ_S/ρ_B) of the training halves per bin (index iy · nx + ix), null where masked, with errors. */
  logRatio: { value: JsonNumber[]; error: JsonNumber[]; masked: number[]; excessPerJet: number };
  /** The Poisson emission score of every evaluation jet. */
  score: { roc: RocView; distribution: ScoreDistribution };
  variables: VariableTaggerView[];
  regions: { measure: string; proposals: RegionProposal[] };
}
