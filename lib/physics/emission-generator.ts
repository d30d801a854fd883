// A small primary-emission generator of our own, for demo samples and closure tests of the declustering.
// A leading parton (quark or gluon) radiates massless emissions in order of decreasing angle, drawn by the veto
// algorithm from the leading-order density of lo-density.ts in the region 0 < ln(R/Δ), kt > ktCut, z ≤ 1/2.
// It is not a parton shower: emissions do not branch further and there is no hadronisation.
import { azimuth, fromPtYPhiM, rapidity, TWO_PI } from './fourvector';
import { colourFactor, type Parton, splittingWeight } from './lo-density';
import { alphaS, PERTURBATIVE_KT_MIN } from './running-coupling';
import { Rng } from './random';

export interface SoftBackground {
  /** Mean number of particles per unit area of the (y, φ) plane. */
  perUnitArea: number;
  /** Mean of their exponential pt distribution (GeV). */
  meanPt: number;
}

export interface EmissionSettings {
  parton: Parton;
  /** Transverse momentum of the leading parton before it radiates (GeV). */
  pt: number;
  /** Jet radius: emissions have Δ < R. */
  R: number;
  /** The leading parton's rapidity is uniform in [−yMax, yMax]. */
  yMax: number;
  /** Emissions have kt above this (GeV); the expectation stops at PERTURBATIVE_KT_MIN, so this cannot be lower. */
  ktCut: number;
  /** Draw z from the hard-collinear splitting functions instead of the soft-collinear constant 2 C_i. */
  hardCollinear: boolean;
  /** Soft particles spread uniformly over the jet's disc (a fictional detector's underlying activity), or null. */
  background: SoftBackground | null;
}

export interface GeneratedRecord {
  id: string;
  weight: number;
  /** px, py, pz, E in GeV, four doubles a particle; the leading parton first. */
  particles: Float64Array;
}

const Z_MAX = 0.5;
/**
 * Upper bound of splittingWeight over 0 < z ≤ 1/2, in units of C_i: its largest values are at z = 1/2,
 * 2.5 C_F for a quark and 8 = 2.67 C_A for a gluon (lo-density tests), so 3 C_i bounds both.
 */
const HARD_COLLINEAR_BOUND = 3;
/** Largest mean number of background particles a jet may ask for (Knuth's Poisson sampler stays exact). */
const MAX_BACKGROUND_MEAN = 500;

/** Why the settings cannot generate jets, or null when they can. */
export function emissionSettingsProblem(s: EmissionSettings): string | null {
  const positive = (v: number) => Number.isFinite(v) && v > 0;
  try {
    colourFactor(s.parton);
  } catch (error) {
    return (error as Error).message;
  }
  if (!positive(s.pt)) return `pt must be a positive number of GeV (got ${s.pt})`;
  if (!positive(s.R) || s.R > 1.5) return `R must be in (0, 1.5] (got ${s.R})`;
  if (!Number.isFinite(s.yMax) || s.yMax < 0) return `yMax must be a non-negative number (got ${s.yMax})`;
  if (!(s.ktCut >= PERTURBATIVE_KT_MIN) || !Number.isFinite(s.ktCut)) {
    return `ktCut must be at least ${PERTURBATIVE_KT_MIN} GeV, where the expectation stops (got ${s.ktCut})`;
  }
  if (typeof s.hardCollinear !== 'boolean') return 'hardCollinear must be true or false';
  if (s.background !== null) {
    const { perUnitArea, meanPt } = s.background;
    if (!Number.isFinite(perUnitArea) || perUnitArea < 0) return `background perUnitArea must be >= 0 (got ${perUnitArea})`;
    if (!positive(meanPt)) return `background meanPt must be a positive number of GeV (got ${meanPt})`;
    if (perUnitArea * Math.PI * s.R * s.R > MAX_BACKGROUND_MEAN) {
      return `background of ${perUnitArea} per unit area gives more than ${MAX_BACKGROUND_MEAN} particles a jet`;
    }
  }
  return null;
}

function checkedSettings(s: EmissionSettings): EmissionSettings {
  const problem = emissionSettingsProblem(s);
  if (problem) throw new RangeError(`emission generator: ${problem}`);
  return s;
}

/** The massless leading parton as a three-vector; it recoils against every emission. */
interface Leader {
  px: number;
  py: number;
  pz: number;
}

function poisson(rng: Rng, mean: number): number {
  const limit = Math.exp(-mean);
  let count = -1;
  for (let product = 1; product > limit; product *= rng.next()) count++;
  return count;
}

function pushMassless(out: number[], pt: number, y: number, phi: number): void {
  const p = new Float64Array(4);
  fromPtYPhiM(pt, y, phi, 0, p, 0);
  out.push(p[0], p[1], p[2], p[3]);
}

/**
 * Emits b with a fraction z of the leader's pt at distance (1 − z)Δ from it, with azimuth psi around it, and
 * subtracts b's three-momentum from the leader, which stays massless: the recoiled leader then sits about zΔ on
 * the other side, so the declustered pair is Δ apart with z ≈ z and kt ≈ z pt Δ. Three-momentum is conserved;
 * the jet acquires the invariant mass of its emissions.
 */
function emit(leader: Leader, z: number, delta: number, psi: number, out: number[]): void {
  const pt = Math.hypot(leader.px, leader.py);
  const E = Math.hypot(pt, leader.pz);
  const y = rapidity(leader.pz, E);
  const phi = azimuth(leader.px, leader.py);
  const at = out.length;
  pushMassless(out, z * pt, y + (1 - z) * delta * Math.sin(psi), phi + (1 - z) * delta * Math.cos(psi));
  leader.px -= out[at];
  leader.py -= out[at + 1];
  leader.pz -= out[at + 2];
}

/** A direction in the (y, φ) plane. */
export interface JetAxis {
  y: number;
  phi: number;
}

/** An emission as the generator drew it (before any recoil): opening angle, softer fraction, kt = z pt Δ (GeV). */
export type EmissionListener = (delta: number, z: number, kt: number) => void;

/**
 * One jet's particles (px, py, pz, E), leading parton first, then the emissions in order, then background. The
 * leading parton starts along `axis`, or along a direction drawn uniformly in |y| ≤ yMax and φ. `onEmission` hears
 * every accepted emission as drawn (closure tests compare those with the leading-order density).
 */
export function generateEmissionJet(rng: Rng, settings: EmissionSettings, axis?: JetAxis, onEmission?: EmissionListener): Float64Array {
  const s = checkedSettings(settings);
  const y0 = axis ? axis.y : rng.uniform(-s.yMax, s.yMax);
  const phi0 = axis ? axis.phi : rng.uniform(0, TWO_PI);
  const start = new Float64Array(4);
  fromPtYPhiM(s.pt, y0, phi0, 0, start, 0);
  const leader: Leader = { px: start[0], py: start[1], pz: start[2] };
  const emissions: number[] = [];

  // Veto algorithm in ℓ = ln(R/Δ), increasing (decreasing angle). The overestimate is a constant density
  // A = α_s(ktCut) G / π over ln kt in [ln ktCut, ln ktCut + L0 − ℓ], the z ≤ 1/2 edge for the initial pt
  // (the leader's pt only falls). Its integral from ℓ_prev to ℓ is A/2 [(L0 − ℓ_prev)² − (L0 − ℓ)²].
  const bound = (s.hardCollinear ? HARD_COLLINEAR_BOUND : 2) * colourFactor(s.parton);
  const A = (alphaS(s.ktCut) * bound) / Math.PI;
  const L0 = Math.log((Z_MAX * s.pt * s.R) / s.ktCut);
  let room2 = L0 > 0 ? L0 * L0 : 0; // (L0 − ℓ)², ℓ = 0 at the jet radius
  for (;;) {
    room2 += (2 / A) * Math.log(1 - rng.next());
    if (room2 <= 0) break;
    const room = Math.sqrt(room2);
    const delta = s.R * Math.exp(room - L0);
    const kt = s.ktCut * Math.exp(room * rng.next());
    const z = kt / (Math.hypot(leader.px, leader.py) * delta);
    if (z > Z_MAX) continue;
    const weight = s.hardCollinear ? splittingWeight(s.parton, z) : 2 * colourFactor(s.parton);
    const acceptance = (alphaS(kt) * weight) / (alphaS(s.ktCut) * bound);
    if (acceptance > 1) throw new Error(`emission generator: overestimate too small at z = ${z} (ratio ${acceptance})`);
    if (rng.next() < acceptance) {
      onEmission?.(delta, z, kt);
      emit(leader, z, delta, rng.uniform(-Math.PI, Math.PI), emissions);
    }
  }

  const particles: number[] = [];
  const leaderPt = Math.hypot(leader.px, leader.py);
  particles.push(leader.px, leader.py, leader.pz, Math.hypot(leaderPt, leader.pz), ...emissions);
  if (s.background !== null) {
    const n = poisson(rng, s.background.perUnitArea * Math.PI * s.R * s.R);
    for (let k = 0; k < n; k++) {
      const r = s.R * Math.sqrt(rng.next()); // uniform over the disc
      const angle = rng.uniform(-Math.PI, Math.PI);
      pushMassless(particles, rng.exponential(s.background.meanPt), y0 + r * Math.sin(angle), phi0 + r * Math.cos(angle));
    }
  }
  return Float64Array.from(particles);
}

/** `count` jets as records of content "jets", reproducible from the seed; ids are `${idPrefix}${k + 1}`. */
export function* generateEmissionRecords(
  settings: EmissionSettings,
  count: number,
  seed: number,
  idPrefix = 'j',
): Generator<GeneratedRecord> {
  checkedSettings(settings);
  if (!Number.isInteger(count) || count < 0) throw new RangeError(`jet count must be a non-negative integer (got ${count})`);
  if (!Number.isInteger(seed)) throw new RangeError(`seed must be an integer (got ${seed})`);
  const rng = new Rng(seed);
  for (let k = 0; k < count; k++) yield { id: `${idPrefix}${k + 1}`, weight: 1, particles: generateEmissionJet(rng, settings) };
}

/** Whole events of two jets recoiling against each other, with a uniform soft underlying activity. */
export interface DijetEventSettings {
  /** Each jet's initiating parton is a quark with this probability, else a gluon. */
  quarkFraction: number;
  /** The leading parton's pt is drawn from dN/dpt ∝ pt^(−spectrumPower) in [ptMin, ptMax] (GeV). */
  ptMin: number;
  ptMax: number;
  spectrumPower: number;
  /** Radiation of each jet (its parton and pt come from the event; no per-jet background). */
  jet: Omit<EmissionSettings, 'parton' | 'pt' | 'background'>;
  /** Soft particles uniform in |y| < yMax and φ, exponential in pt; null for none. */
  underlying: (SoftBackground & { yMax: number }) | null;
}

/** Why the settings cannot generate events, or null when they can. */
export function dijetSettingsProblem(s: DijetEventSettings): string | null {
  if (!(s.quarkFraction >= 0 && s.quarkFraction <= 1)) return `quarkFraction must be in [0, 1] (got ${s.quarkFraction})`;
  if (!(s.ptMin > 0 && s.ptMax >= s.ptMin && Number.isFinite(s.ptMax))) return `need 0 < ptMin <= ptMax (got ${s.ptMin}, ${s.ptMax})`;
  if (!(s.spectrumPower > 1 && Number.isFinite(s.spectrumPower))) return `spectrumPower must be a number above 1 (got ${s.spectrumPower})`;
  const jetProblem = emissionSettingsProblem({ ...s.jet, parton: 'quark', pt: s.ptMin, background: null });
  if (jetProblem) return jetProblem;
  if (s.underlying !== null) {
    const { perUnitArea, meanPt, yMax } = s.underlying;
    if (!(perUnitArea >= 0 && Number.isFinite(perUnitArea))) return `underlying perUnitArea must be >= 0 (got ${perUnitArea})`;
    if (!(meanPt > 0 && Number.isFinite(meanPt))) return `underlying meanPt must be a positive number of GeV (got ${meanPt})`;
    if (!(yMax > 0 && Number.isFinite(yMax))) return `underlying yMax must be a positive number (got ${yMax})`;
    if (perUnitArea * 2 * yMax * TWO_PI > MAX_BACKGROUND_MEAN) {
      return `underlying activity of ${perUnitArea} per unit area gives more than ${MAX_BACKGROUND_MEAN} particles an event`;
    }
  }
  return null;
}

/** Inverse of the power-law spectrum's cumulative distribution at u in [0, 1). */
function powerLawPt(u: number, s: DijetEventSettings): number {
  const k = 1 - s.spectrumPower;
  const a = Math.pow(s.ptMin, k);
  return Math.pow(a + u * (Math.pow(s.ptMax, k) - a), 1 / k);
}

/**
 * One event's particles (px, py, pz, E): two jets, the second with 70–100 % of the first one's pt and roughly
 * opposite in azimuth (a Gaussian spread of 0.1 rad), each at a rapidity uniform in |y| ≤ jet.yMax, then the
 * underlying activity. Not a physics simulation: a plausible event shape with known ingredients.
 */
export function generateDijetEvent(rng: Rng, settings: DijetEventSettings): Float64Array {
  const problem = dijetSettingsProblem(settings);
  if (problem) throw new RangeError(`event generator: ${problem}`);
  const s = settings;
  const pt1 = powerLawPt(rng.next(), s);
  const phi1 = rng.uniform(0, TWO_PI);
  const legs = [
    { pt: pt1, axis: { y: rng.uniform(-s.jet.yMax, s.jet.yMax), phi: phi1 } },
    { pt: pt1 * rng.uniform(0.7, 1), axis: { y: rng.uniform(-s.jet.yMax, s.jet.yMax), phi: (phi1 + Math.PI + 0.1 * rng.normal() + TWO_PI) % TWO_PI } },
  ];
  const parts: Float64Array[] = [];
  for (const leg of legs) {
    const parton: Parton = rng.next() < s.quarkFraction ? 'quark' : 'gluon';
    parts.push(generateEmissionJet(rng, { ...s.jet, parton, pt: leg.pt, background: null }, leg.axis));
  }
  const soft: number[] = [];
  if (s.underlying !== null) {
    const { perUnitArea, meanPt, yMax } = s.underlying;
    const n = poisson(rng, perUnitArea * 2 * yMax * TWO_PI);
    for (let k = 0; k < n; k++) pushMassless(soft, rng.exponential(meanPt), rng.uniform(-yMax, yMax), rng.uniform(0, TWO_PI));
  }
  const out = new Float64Array(parts[0].length + parts[1].length + soft.length);
  out.set(parts[0], 0);
  out.set(parts[1], parts[0].length);
  out.set(soft, parts[0].length + parts[1].length);
  return out;
}
