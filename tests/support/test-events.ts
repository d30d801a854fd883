// Seeded pseudo-random test inputs for the tests and the benchmark (not physics simulation: plausible shapes
// with collimated sprays, soft background, optional masses, and awkward placements such as φ ≈ 0 ≈ 2π).
// Random numbers come from the engine's seeded generator (lib/physics/random.ts).

import { TWO_PI, fromPtYPhiM } from '../../lib/physics/fourvector';
import { Rng } from '../../lib/physics/random';

function rngOf(seed: number | Rng): Rng {
  return typeof seed === 'number' ? new Rng(seed) : seed;
}

/** Hadron-like masses (GeV) used when particles are massive: π±, K±, p, and a few heavier "clusters". */
const MASSES = [0.13957, 0.13957, 0.13957, 0.493677, 0.938272, 1.5, 3.0];

/** A particle mass: one of MASSES with probability `massiveFraction`, else 0. */
function mass(rng: Rng, massiveFraction: number): number {
  return rng.next() < massiveFraction ? MASSES[rng.int(0, MASSES.length - 1)] : 0;
}

/** A spray axis azimuth: uniform, or within ±halfWidth of φ = 0 ≡ 2π when nearWrap. */
function axisPhi(rng: Rng, nearWrap: boolean | undefined, halfWidth: number): number {
  return nearWrap ? (rng.uniform(-halfWidth, halfWidth) + TWO_PI) % TWO_PI : rng.uniform(0, TWO_PI);
}

/** Options of sprays, events and jets. */
export interface ShapeOptions {
  /** Angular scale of the sprays (distance of a typical particle from the axis). Default 0.15 (jets: 0.12). */
  spread?: number;
  /** Fraction of massive particles (0..1). Default 0. */
  massiveFraction?: number;
  /** Place the spray axes close to φ = 0 ≡ 2π, so jets straddle the wrap (events and jets). Default false. */
  nearPhiWrap?: boolean;
}

export interface SprayOptions extends ShapeOptions {
  /** Number of particles. */
  n: number;
  /** Total pt (GeV) of the spray (approximately: particles are massive or not). */
  pt: number;
  /** Axis rapidity and azimuth. */
  y: number;
  phi: number;
}

/**
 * Writes a collimated spray of particles at out[4·at..]: angles from the axis are |gaussian|·spread with a
 * tail (hard-collinear core plus wider soft radiation), momentum fractions from a steeply falling distribution.
 */
function spray(rng: Rng, o: SprayOptions, out: Float64Array, at: number): void {
  const spread = o.spread ?? 0.15;
  const mf = o.massiveFraction ?? 0;
  const n = o.n;
  // Momentum fractions: x ∝ exp(−4u)·(a few hard ones), normalised.
  const xs = new Float64Array(n);
  let sum = 0;
  for (let i = 0; i < n; i++) {
    const x = i < 2 ? rng.uniform(0.3, 1) : Math.exp(-6 * rng.next()) * rng.uniform(0.05, 1);
    xs[i] = x;
    sum += x;
  }
  for (let i = 0; i < n; i++) {
    const ptI = (o.pt * xs[i]) / sum;
    // Softer particles go wider.
    const r = Math.abs(rng.normal()) * spread * (0.3 + 1.5 * Math.sqrt(1 - xs[i] / (xs[i] + 0.2)));
    const th = rng.uniform(0, TWO_PI);
    const y = o.y + r * Math.cos(th);
    let phi = o.phi + r * Math.sin(th);
    phi -= TWO_PI * Math.floor(phi / TWO_PI);
    fromPtYPhiM(ptI, y, phi, mass(rng, mf), out, 4 * (at + i));
  }
}

export interface EventOptions extends ShapeOptions {
  /** Total number of particles (jets + background). */
  nParticles: number;
  /** Number of jets (collimated sprays). Default 3. */
  nJets?: number;
  /** Fraction of the particles that belong to the sprays. Default 0.5. */
  jetFraction?: number;
  /** Spray pt range (GeV). Default [40, 400]. */
  jetPt?: [number, number];
  /** Spray axes have |y| below this. Default 2.2. */
  jetYMax?: number;
  /** Background particles are uniform in |y| < this. Default 4. */
  backgroundYMax?: number;
  /** Mean background pt (GeV; exponential above 0.2). Default 1. */
  backgroundPt?: number;
}

/** One event of N particles: a few collimated sprays plus soft uniform background. px,py,pz,E interleaved. */
export function generateEvent(seed: number | Rng, o: EventOptions): Float64Array {
  const rng = rngOf(seed);
  const N = o.nParticles;
  const nJets = Math.max(0, Math.min(o.nJets ?? 3, N));
  const [ptLo, ptHi] = o.jetPt ?? [40, 400];
  const jetYMax = o.jetYMax ?? 2.2;
  const bgY = o.backgroundYMax ?? 4;
  const bgPt = o.backgroundPt ?? 1;
  const mf = o.massiveFraction ?? 0;
  const out = new Float64Array(4 * N);
  const nInJets = nJets === 0 ? 0 : Math.max(nJets, Math.round(N * (o.jetFraction ?? 0.5)));
  let at = 0;
  for (let j = 0; j < nJets; j++) {
    const nj = Math.floor(nInJets / nJets) + (j < nInJets % nJets ? 1 : 0);
    const phi = axisPhi(rng, o.nearPhiWrap, 0.15);
    spray(rng, {
      n: nj,
      pt: ptLo * Math.pow(ptHi / ptLo, rng.next()),
      y: rng.uniform(-jetYMax, jetYMax),
      phi,
      spread: o.spread,
      massiveFraction: mf,
    }, out, at);
    at += nj;
  }
  for (; at < N; at++) {
    const m = mass(rng, mf);
    fromPtYPhiM(0.2 + rng.exponential(bgPt), rng.uniform(-bgY, bgY), rng.uniform(0, TWO_PI), m, out, 4 * at);
  }
  // Shuffle so that jets' particles are not contiguous (Fisher–Yates on particles).
  for (let i = N - 1; i > 0; i--) {
    const k = rng.int(0, i);
    for (let c = 0; c < 4; c++) {
      const t = out[4 * i + c];
      out[4 * i + c] = out[4 * k + c];
      out[4 * k + c] = t;
    }
  }
  return out;
}

export interface JetOptions extends ShapeOptions {
  /** Number of constituents. */
  nConstituents: number;
  /** Jet pt (GeV). Default: uniform in [100, 1000]. */
  pt?: number;
  /** Axis; defaults: y uniform in ±2, φ uniform (or near 0 with nearPhiWrap). */
  y?: number;
  phi?: number;
}

/** One pre-clustered jet: a spray of nConstituents particles. px,py,pz,E interleaved. */
export function generateJet(seed: number | Rng, o: JetOptions): Float64Array {
  const rng = rngOf(seed);
  const n = o.nConstituents;
  const out = new Float64Array(4 * n);
  const phi = o.phi ?? axisPhi(rng, o.nearPhiWrap, 0.1);
  spray(rng, {
    n,
    pt: o.pt ?? rng.uniform(100, 1000),
    y: o.y ?? rng.uniform(-2, 2),
    phi,
    spread: o.spread ?? 0.12,
    massiveFraction: o.massiveFraction,
  }, out, 0);
  return out;
}

/** `count` events from one seed. */
export function generateEvents(seed: number, count: number, o: EventOptions): Float64Array[] {
  const rng = new Rng(seed);
  const out: Float64Array[] = [];
  for (let i = 0; i < count; i++) out.push(generateEvent(rng, o));
  return out;
}

/** `count` jets from one seed; the constituent count varies by ±spreadN around nConstituents (default ±20%). */
export function generateJets(seed: number, count: number, o: JetOptions & { spreadN?: number }): Float64Array[] {
  const rng = new Rng(seed);
  const out: Float64Array[] = [];
  const dn = o.spreadN ?? Math.round(0.2 * o.nConstituents);
  for (let i = 0; i < count; i++) {
    const n = Math.max(1, o.nConstituents + rng.int(-dn, dn));
    out.push(generateJet(rng, { ...o, nConstituents: n }));
  }
  return out;
}

/** Options of lepton-collider-like events: sprays in isotropic directions plus soft isotropic particles. */
export interface EeEventOptions extends ShapeOptions {
  nParticles: number;
  /** Number of sprays. Default 2 (back to back) or more at random directions. */
  nJets?: number;
  /** Fraction of the particles in the sprays. Default 0.8. */
  jetFraction?: number;
  /** Spray momentum range (GeV). Default [10, 60]. */
  jetP?: [number, number];
}

/**
 * One e+e- -like event (px,py,pz,E interleaved): sprays along random directions on the sphere (the first two back
 * to back), each made as a spray around the x axis and rotated onto its direction, and soft isotropic particles.
 */
export function generateEeEvent(seed: number | Rng, o: EeEventOptions): Float64Array {
  const rng = rngOf(seed);
  const N = o.nParticles;
  const nJets = o.nJets ?? 2;
  const [pLo, pHi] = o.jetP ?? [10, 60];
  const out = new Float64Array(4 * N);
  const nInJets = Math.round(N * (o.jetFraction ?? 0.8));
  let at = 0;
  let first: [number, number, number] = [1, 0, 0];
  for (let j = 0; j < nJets; j++) {
    let d: [number, number, number];
    if (j === 1) d = [-first[0], -first[1], -first[2]];
    else {
      const cz = rng.uniform(-1, 1), f = rng.uniform(0, TWO_PI), sz = Math.sqrt(1 - cz * cz);
      d = [sz * Math.cos(f), sz * Math.sin(f), cz];
      if (j === 0) first = d;
    }
    const nj = Math.floor(nInJets / nJets) + (j < nInJets % nJets ? 1 : 0);
    const local = new Float64Array(4 * nj);
    spray(rng, { n: nj, pt: pLo * Math.pow(pHi / pLo, rng.next()), y: 0, phi: 0, spread: o.spread ?? 0.15, massiveFraction: o.massiveFraction }, local, 0);
    // Rotation taking e_x onto d (Rodrigues' formula about e_x × d).
    const [dx, dy, dz] = d;
    const c = dx, kx = 0, ky = -dz, kz = dy; // k = e_x × d, |k| = sin
    const s2 = ky * ky + kz * kz;
    const f = s2 > 0 ? (1 - c) / s2 : 0;
    for (let i = 0; i < nj; i++) {
      const x = local[4 * i], y = local[4 * i + 1], z = local[4 * i + 2];
      // v' = v c + (k × v) + k (k·v)(1 − c)/|k|²
      const kv = kx * x + ky * y + kz * z;
      const cxv = ky * z - kz * y, cyv = kz * x - kx * z, czv = kx * y - ky * x;
      out[4 * at] = x * c + cxv + kx * kv * f;
      out[4 * at + 1] = y * c + cyv + ky * kv * f;
      out[4 * at + 2] = z * c + czv + kz * kv * f;
      out[4 * at + 3] = local[4 * i + 3];
      at++;
    }
  }
  for (; at < N; at++) {
    const cz = rng.uniform(-0.98, 0.98), f = rng.uniform(0, TWO_PI), sz = Math.sqrt(1 - cz * cz);
    const p = 0.2 + rng.exponential(1);
    const m = mass(rng, o.massiveFraction ?? 0);
    out[4 * at] = p * sz * Math.cos(f);
    out[4 * at + 1] = p * sz * Math.sin(f);
    out[4 * at + 2] = p * cz;
    out[4 * at + 3] = Math.sqrt(p * p + m * m);
  }
  return out;
}

/** `count` e+e- -like events from one seed. */
export function generateEeEvents(seed: number, count: number, o: EeEventOptions): Float64Array[] {
  const rng = new Rng(seed);
  return Array.from({ length: count }, () => generateEeEvent(rng, o));
}

/**
 * Charges of a few particle codes as the Review of Particle Physics lists them (π±, K±, p, n, γ, K0L, e, μ, ν,
 * Λ, Σ−, π0 — literal values, independent of lib/physics/particle-id.ts).
 */
export const LISTED_CHARGES: Record<number, number> = {
  211: 1, [-211]: -1, 321: 1, [-321]: -1, 2212: 1, [-2212]: -1, 2112: 0, [-2112]: 0, 22: 0, 130: 0, 310: 0,
  11: -1, [-11]: 1, 13: -1, [-13]: 1, 12: 0, [-12]: 0, 14: 0, 16: 0, [-16]: 0, 3122: 0, 3112: -1, 111: 0,
};
const LISTED_CODES = Object.keys(LISTED_CHARGES).map(Number);

/** A code of LISTED_CHARGES for each particle (seeded), and its listed charge. */
export function listedPids(seed: number, nParticles: number): { pid: Int32Array; charge: Float64Array } {
  const rng = new Rng(seed);
  const pid = new Int32Array(nParticles);
  const charge = new Float64Array(nParticles);
  for (let i = 0; i < nParticles; i++) {
    pid[i] = LISTED_CODES[rng.int(0, LISTED_CODES.length - 1)];
    charge[i] = LISTED_CHARGES[pid[i]];
  }
  return { pid, charge };
}

/** Pseudorapidity and azimuth of the particle with the largest pt (where a tag hadron placed along it lands in a jet). */
export function hardestDirection(p: Float64Array): [number, number] {
  let best = 0;
  for (let i = 4; i < p.length; i += 4) if (Math.hypot(p[i], p[i + 1]) > Math.hypot(p[best], p[best + 1])) best = i;
  return [Math.asinh(p[best + 2] / Math.hypot(p[best], p[best + 1])), Math.atan2(p[best + 1], p[best])];
}
