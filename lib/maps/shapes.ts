// The JSON the map, contrast and projection routes answer (README "Maps and contrasts"). Types only, so pages import
// them. Numbers that are undefined (a ratio over an empty bin, a masked bin) are null in JSON.
import type { AxisBins } from '@/lib/physics/plane/bins';
import type { SoftDropSettings } from '@/lib/physics/types';
import type { JetSummary } from './jet-summary';
import type { PlaneView } from './view-settings';

export type JsonNumber = number | null;

/** What a view needs to know of each sample it shows. */
export interface SampleRef {
  id: number;
  name: string;
  label: string;
  tags: string[];
  studyId: number;
  /** SHA-256 of the uploaded file. */
  fileHash: string;
  /** Jet radius of the jet definition. */
  R: number;
  /** Hadron collider (Δ, kₜ = pₜ Δ) or e+e− (the angle θ, kₜ = E sin θ): which variables the plane holds. */
  collision: 'hadron' | 'ee';
  /** Stored splittings: the primary sequence or the full C/A tree. */
  tree: 'primary' | 'full';
  softDrop: SoftDropSettings;
  multiplicityKtCut: number;
  /** Jets processing dropped, by the first cut that failed (pt, |y|, rank), before any map selection. */
  processingRejected: { pt: number; y: number; rank: number } | null;
  softwareVersion: string | null;
}

/** A per-jet density on its bins: `density[iy * nx + ix]`, error = √variance, count = raw splittings (null: unknown). */
export interface PlaneData {
  xEdges: number[];
  yEdges: number[];
  density: number[];
  error: number[];
  count: number[] | null;
}

export interface JetCounts {
  stored: number;
  selected: number;
  /** N_jet = Σ w over the selected jets. */
  weight: number;
  rejected: { pt: number; absY: number; leading: number; filter: number };
  medianPt: JsonNumber;
}

/** Splittings per jet that no shown bin holds, in total and by side (per jet too). */
export interface OutsideView {
  perJet: number;
  count: number | null;
  left: number;
  right: number;
  below: number;
  above: number;
  undefined: number;
}

/** One sample's plane in a view. */
export interface SamplePlane {
  sample: SampleRef;
  plane: PlaneData;
  jets: JetCounts;
  outside: OutsideView;
  /** ∫ρ over the shown bins plus outside.perJet: every splitting of the plane per selected jet. */
  splittingsPerJet: number;
  source: 'cache' | 'columns';
}

export interface MapResult extends SamplePlane {
  view: PlaneView;
  bins: { x: AxisBins; y: AxisBins };
  summary: JetSummary;
}

export type ContrastModeName = 'ratio' | 'difference' | 'pull';

export interface Comparison {
  /** Sample ids: the reference A (the first input) and B. */
  reference: number;
  sample: number;
  mode: ContrastModeName;
  value: JsonNumber[];
  error: JsonNumber[];
  /** 1 where masked for too few entries. */
  masked: number[];
  chi2: number;
  ndf: number;
}

export interface ContrastResult {
  view: PlaneView;
  bins: { x: AxisBins; y: AxisBins };
  mode: ContrastModeName;
  minEntries: number;
  inputs: SamplePlane[];
  comparisons: Comparison[];
}

export interface ProjectionSeries {
  sample: SampleRef;
  density: number[];
  error: number[];
  medianPt: JsonNumber;
  jetWeight: number;
}

export interface ProjectionResult {
  view: PlaneView;
  bins: { x: AxisBins; y: AxisBins };
  onto: 'x' | 'y';
  /** The slice of the other coordinate actually summed (whole bins). */
  slice: { from: number; to: number };
  edges: number[];
  series: ProjectionSeries[];
  /** Each later series over the first. */
  ratios: Array<{ reference: number; sample: number; value: JsonNumber[]; error: JsonNumber[] }>;
}
