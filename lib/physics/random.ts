// A seeded pseudo-random number generator for the emission generator, the demo samples and the tests.
//
// The generator is mulberry32 (Tommy Ettinger, 2017, public domain; a 32-bit state, period 2^32, passes
// gjrand/PractRand to a few GB): small, fast and reproducible across platforms because it only uses 32-bit
// integer arithmetic (Math.imul) and one division by 2^32.

import { TWO_PI } from './fourvector';

export class Rng {
  private s: number;
  constructor(seed: number) {
    this.s = seed >>> 0;
  }
  /** Uniform in [0, 1) (32-bit resolution). mulberry32. */
  next(): number {
    this.s = (this.s + 0x6d2b79f5) >>> 0;
    let t = this.s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  }
  uniform(a: number, b: number): number {
    return a + (b - a) * this.next();
  }
  /** Integer in [a, b]. */
  int(a: number, b: number): number {
    return a + Math.floor(this.next() * (b - a + 1));
  }
  /** Standard normal (Box–Muller). */
  normal(): number {
    const u = 1 - this.next(); // (0, 1]
    const v = this.next();
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(TWO_PI * v);
  }
  /** Exponential with the given mean. */
  exponential(mean: number): number {
    return -mean * Math.log(1 - this.next());
  }
}
