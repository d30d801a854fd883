// Shared shapes of the physics engine. Everything under lib/physics is pure TypeScript:
// no framework, no Node-only imports, so the CLI, the worker threads and the server use the same code.

export type Algorithm = 'antikt' | 'kt' | 'ca';

/** Jet finding and selection (PHYSICS.md "Jet clustering"). */
export interface JetDefinition {
  algorithm: Algorithm;
  /** Jet radius R. */
  R: number;
  /** Keep jets with pt > ptMin (GeV). */
  ptMin: number;
  /** Keep jets with |y| < yMax. */
  yMax: number;
  /** Keep at most this many leading jets (by pt) per record; null = all. */
  maxJets: number | null;
}

/**
 * SoftDrop parameters (arXiv:1402.2657). `mode` (PHYSICS.md "Derived jet observables"): 'grooming' (the default
 * when absent) keeps a jet whose splittings all fail as its last harder constituent (z_g = R_g = 0); 'tagging'
 * marks such a jet as failing (m_g, z_g, R_g NaN).
 */
export interface SoftDropSettings {
  zCut: number;
  beta: number;
  R0: number;
  mode?: SoftDropMode;
}

export type SoftDropMode = 'grooming' | 'tagging';

export interface ProcessSettings {
  /** 'events': find jets in each record; 'jets': each record is already one jet's constituents. */
  content: 'events' | 'jets';
  jet: JetDefinition;
  softDrop: SoftDropSettings;
  /** Primary emission multiplicity counts primary splittings with kt above this (GeV). */
  multiplicityKtCut: number;
  /** Also return every splitting of the C/A tree with its generation. */
  fullTree: boolean;
}

/**
 * One splitting is SPLIT_STRIDE consecutive doubles in a Float64Array, in this order.
 * lnInvDelta = ln(1/Δ), lnKt = ln(kt/GeV), kappa = zΔ, generation = 1 for primary (PHYSICS.md).
 */
export const SPLIT_FIELDS = ['lnInvDelta', 'lnKt', 'z', 'delta', 'kt', 'psi', 'm', 'kappa', 'generation'] as const;
export const SPLIT_STRIDE = SPLIT_FIELDS.length;
export const S_LN_INV_DELTA = 0;
export const S_LN_KT = 1;
export const S_Z = 2;
export const S_DELTA = 3;
export const S_KT = 4;
export const S_PSI = 5;
export const S_M = 6;
export const S_KAPPA = 7;
export const S_GENERATION = 8;

export interface SoftDropResult {
  /** Groomed jet mass; when no splitting passes: the last constituent's mass (grooming), NaN (tagging). */
  mg: number;
  /** z of the stopping splitting; when none passes: 0 (grooming), NaN (tagging). */
  zg: number;
  /** Δ of the stopping splitting; when none passes: 0 (grooming), NaN (tagging). */
  Rg: number;
}

/**
 * One selected jet. In the `splitfield-declusterings` export (lib/ingest/export.ts, and the FastJet reference
 * tests/reference/fastjet-ref.cc) a jet line carries pt, y, phi, m, n, "primary" (first 7 SPLIT_FIELDS per
 * splitting), "all" ([generation, lnInvDelta, lnKt, z] per splitting, only with the full tree),
 * "sd": [mg, zg, Rg] (null where NaN) and "mult" (= multiplicity).
 */
export interface JetResult {
  pt: number;
  y: number;
  /** Azimuth in [0, 2π). */
  phi: number;
  m: number;
  /** Number of constituents. */
  n: number;
  /** Primary splittings in declustering order (hardest-angle first), SPLIT_STRIDE doubles each. */
  primary: Float64Array;
  /** Every splitting of the C/A tree (depth-first, harder branch first), or null unless fullTree. */
  all: Float64Array | null;
  softDrop: SoftDropResult;
  /** Primary splittings with kt > multiplicityKtCut. */
  multiplicity: number;
}

/** Jets that a record's jet finding produced but the selection dropped, by the first cut that failed. */
export interface RejectedCounts {
  pt: number;
  y: number;
  rank: number;
}

export interface RecordResult {
  /** Selected jets, sorted by pt descending; index in this array = the export's `jet`. */
  jets: JetResult[];
  rejected: RejectedCounts;
}
