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
  /**
   * Exclusive jets instead of inclusive ones (clustering/exclusive.ts): the whole event clustered to exactly n
   * jets, or until the smallest distance exceeds dcut (hadron collider: kt or C/A, d in GeV^2p), or ycut
   * (e+e- Durham and Cambridge: y = d / E_vis^2). Missing or null: inclusive jets.
   */
  exclusive?: ExclusiveJets | null;
}

export type ExclusiveJets = { n: number } | { dcut: number } | { ycut: number };

/** Hadron collider (pt, rapidity, azimuth; the default) or lepton collider (energy and angles). */
export type CollisionType = 'hadron' | 'ee';

/** e+e- jet finding (PHYSICS.md "Lepton-collider (e+e-) events"). */
export interface EeJetDefinition {
  /** Durham (exclusive n or ycut), e+e- Cambridge (ycut), generalised e+e- kt with radius jet.R (inclusive). */
  algorithm: 'durham' | 'cambridge' | 'genkt';
  /** Exponent p of the generalised e+e- kt algorithm (1 kt-like, 0 C/A-like, -1 anti-kt-like). */
  p: number;
  /** Keep jets with E > eMin (GeV). */
  eMin: number;
}

/**
 * Which particles take part (before jet finding for events, before re-clustering for jets). Each removed
 * particle is counted under the first rule it fails, in the order of RemovedParticles.
 */
export interface ConstituentSelection {
  /** Drop neutrinos (|pid| 12, 14, 16, 18): common practice for particle-level jets. Needs pid. */
  dropNeutrinos: boolean;
  /** Drop particles whose |pid| is listed (a code stands for the particle and its antiparticle). Needs pid. */
  pidExclude: number[];
  /** Keep only particles whose |pid| is listed; empty = no such rule. Needs pid. */
  pidInclude: number[];
  /** Keep only charged particles: from "charge" when the record has it, else from pid. */
  chargedOnly: boolean;
  /** Keep particles with pt > ptMin (GeV); 0 keeps all. */
  ptMin: number;
  /** Keep particles with |y| (or |eta|) < rapidityMax; null = no limit. */
  rapidityMax: number | null;
  rapidityKind: 'y' | 'eta';
}

/** Particles removed by the constituent selection, by the first rule each failed. */
export interface RemovedParticles {
  neutrino: number;
  pidExcluded: number;
  pidNotIncluded: number;
  neutral: number;
  pt: number;
  rapidity: number;
}

export const REMOVED_RULES = ['neutrino', 'pidExcluded', 'pidNotIncluded', 'neutral', 'pt', 'rapidity'] as const;

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
  /** Missing: 'hadron'. */
  collision?: CollisionType;
  /** e+e- jet finding; used when collision is 'ee'. */
  ee?: EeJetDefinition;
  /** Constituent selection; missing: every particle. */
  particles?: ConstituentSelection;
  /** Tag jets b, c or light by ghost association of the record's tag hadrons (events only). */
  flavourTags?: boolean;
}

/** The extra per-particle information of a record, beside its momenta. */
export interface RecordExtras {
  pid?: Int32Array;
  charge?: Float64Array;
  /** Tag particles (heavy-flavour hadrons for ghost association): px, py, pz, E interleaved, GeV. */
  tags?: Float64Array;
  /** Their pids (same count as tags). */
  tagPid?: Int32Array;
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
  /** Flavour tag: 5 b, 4 c, 0 light; missing (or -1) when tags were not asked for. */
  flavour?: number;
  /** Energy and polar angle atan2(pt, pz); set by the e+e- engine (missing: computed from pt, y, m). */
  E?: number;
  theta?: number;
}

/** Jets that a record's jet finding produced but the selection dropped, by the first cut that failed. */
export interface RejectedCounts {
  pt: number;
  y: number;
  rank: number;
}

export interface RecordResult {
  /** Selected jets, sorted by pt (e+e-: energy) descending; index in this array = the export's `jet`. */
  jets: JetResult[];
  rejected: RejectedCounts;
  /** Particles the constituent selection removed (missing when there was no selection). */
  removed?: RemovedParticles;
}
