// Writes a double as JavaScript's Number::toString writes it (the shortest digits that read back to the same
// double, the closest to it among those: ECMA-262 Number::toString; JSON.stringify writes numbers so), straight
// into a byte buffer (measured about 3× faster than String(x) on the export's numbers, and no string or array is made). Exact
// arithmetic decides every case it answers: the candidates of 15, 16 and 17 significant digits are the integers
// nearest to x·10^k, which Dekker's twoProduct gives exactly (T. J. Dekker, "A floating-point technique for
// extending the available precision", Numer. Math. 18 (1971) 224, with Veltkamp's splitting: no fused multiply-add
// in JavaScript; 10^k is an exact double for k ≤ 22), and a candidate reads back to x iff it lies inside x's
// rounding interval (half a unit in the last place on either side, a quarter below a power of two), scaled by
// the same 10^k: an exact comparison. 15 digits leave room for one candidate at most; among 16-
// and 17-digit candidates the nearest to x is the closest. Anything else — magnitudes outside [1e-6, 1e15), a
// candidate on the interval's edge, exact ties, powers of two needing 17 digits — is left to String(x), so the
// text is always String(x)'s.

/** 10^k for k = 0..22: every one is an exact double (5^22 < 2^53). */
export const POW10 = Float64Array.from({ length: 23 }, (_, k) => Number(`1e${k}`));
/** 2^(e − POW2_OFFSET) for e = 0..2099: POW2[k + POW2_OFFSET] = 2^k for every normal exponent k. */
const POW2_OFFSET = 1100;
const POW2 = Float64Array.from({ length: 2100 }, (_, e) => Math.pow(2, e - POW2_OFFSET));
/** A double and its two 32-bit words (u32[HI] holds the sign, exponent and top of the mantissa). */
const f64 = new Float64Array(1);
const u32 = new Uint32Array(f64.buffer);
const HI = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1 ? 1 : 0;
const LO = 1 - HI;

/** Writes the decimal digits of a non-negative integer below 2^31; returns the position after them. */
export function writeInteger(buf: Uint8Array, at: number, n: number): number {
  if (n < 10) {
    buf[at] = 48 + n;
    return at + 1;
  }
  let len = 0;
  for (let m = n; m > 0; m = Math.floor(m * 0.1)) len++;
  let i = at + len;
  for (let m = n; m > 0; ) {
    const next = Math.floor(m * 0.1); // exact floor(m / 10): 0.1 rounds up, m is small
    buf[--i] = 48 + m - next * 10;
    m = next;
  }
  return at + len;
}

function writeString(buf: Uint8Array, at: number, s: string): number {
  for (let i = 0; i < s.length; i++) buf[at + i] = s.charCodeAt(i);
  return at + s.length;
}

/** "0000".."9999": four ASCII digits for each n < 10^4, at 4n. */
const DIGITS4 = Uint8Array.from({ length: 40000 }, (_, i) => 48 + (Math.floor((i >> 2) / [1000, 100, 10, 1][i & 3]) % 10));

/** Puts the 4 digits of n (< 10^4) at buf[at..at+4). */
function put4(buf: Uint8Array, at: number, n: number): void {
  const s = n << 2;
  buf[at] = DIGITS4[s];
  buf[at + 1] = DIGITS4[s + 1];
  buf[at + 2] = DIGITS4[s + 2];
  buf[at + 3] = DIGITS4[s + 3];
}

/**
 * Writes the integer q·10^8 + r (q in [10^6, 10^9], r below 10^8) scaled by 10^−scale in Number::toString's
 * fixed notation (the value lies in [1e-6, 1e15), where that notation is used). Small integer arguments only:
 * doubles passed to a function that is not inlined would be boxed. The digits are written where they end up
 * (the integer digits one place to the right, then moved left for the point): copying them from a scratch
 * array took a third of the time.
 */
function writeScaled(buf: Uint8Array, at: number, q: number, r: number, scale: number): number {
  const qi = q | 0;
  const ri = r | 0;
  // nd digits in all (q's then r's 8), n of them before the trailing zeros, `point` of them before the point.
  const nq = qi >= 1e9 ? 10 : qi >= 1e8 ? 9 : qi >= 1e7 ? 8 : 7;
  const nd = nq + 8;
  let n = nd;
  if (ri === 0) {
    n = nq;
    for (let x = qi; x % 10 === 0; x = (x / 10) | 0) n--;
  } else {
    for (let x = ri; x % 10 === 0; x = (x / 10) | 0) n--;
  }
  const point = nd - scale;
  let first = at;
  if (point <= 0) {
    buf[at] = 48;
    buf[at + 1] = 46;
    first = at + 2;
    for (let i = point; i < 0; i++) buf[first++] = 48;
  } else if (point < n) first = at + 1;
  // The nd digits from `first` on: r's 8 last, q's before them.
  const end = first + nd;
  const rh = (ri / 10000) | 0;
  put4(buf, end - 8, rh);
  put4(buf, end - 4, ri - rh * 10000);
  let qh = (qi / 10000) | 0;
  put4(buf, end - 12, qi - qh * 10000);
  for (let i = end - 13; i >= first; i--) {
    const next = (qh / 10) | 0;
    buf[i] = 48 + qh - next * 10;
    qh = next;
  }
  if (point <= 0) return first + n;
  if (point < n) {
    for (let i = 0; i < point; i++) buf[at + i] = buf[at + 1 + i];
    buf[at + point] = 46;
    return at + n + 1;
  }
  // A whole number (below 1e15, so point ≤ nd): its last digits are among the zeros written.
  return at + point;
}

/** 2^53: the integers below it are exact doubles. */
export const TWO_53 = 9007199254740992;
export const SPLITTER = 134217729; // 2^27 + 1: Veltkamp's splitting (twoProduct, written out below)
/** 10^k split into a high part of 26 bits and the rest, for the exact products below. */
export const POW10_HI = POW10.map((p) => {
  const t = SPLITTER * p;
  return t - (t - p);
});
export const POW10_LO = POW10.map((p, k) => p - POW10_HI[k]);


function fallback(buf: Uint8Array, at: number, v: number): number {
  return writeString(buf, at, String(v));
}

/**
 * Writes src[i] (a finite double) as String(x) writes it (−0 as "0"); returns the position after it. buf needs
 * room for 26 bytes from `at`. The value is taken from its array (not passed as a double) and the arithmetic is
 * written out in this one function: a double crossing a call that V8 does not inline is boxed.
 */
export function writeDouble(buf: Uint8Array, at: number, src: Float64Array, i: number): number {
  let v = src[i];
  if (v === 0) {
    buf[at] = 48;
    return at + 1;
  }
  if (v < 0) {
    buf[at++] = 45;
    v = -v;
  }
  if (v < 2147483648 && (v | 0) === v) return writeInteger(buf, at, v);
  if (!(v >= 1e-6 && v < 1e15)) return fallback(buf, at, v);
  f64[0] = v;
  const hiWord = u32[HI];
  const e2 = ((hiWord >>> 20) & 0x7ff) - 1023;
  const pow2 = u32[LO] === 0 && (hiWord & 0xfffff) === 0;
  const half = POW2[e2 - 53 + POW2_OFFSET]; // half a unit in the last place of v (exact)
  let t = SPLITTER * v;
  const vh = t - (t - v), vl = v - vh;
  // k such that v·10^k lies in [1e14, 1e15): 15 digits before the point (the binary exponent gives the decimal
  // one to within one, corrected at the first pass). Then the candidates of 15, 16 and 17 digits (j = 0, 1, 2).
  let k = 14 - Math.floor(e2 * 0.3010299956639812);
  // The chosen candidate: hi + lo scaled by 10^−scale.
  let hi = -1, lo = 0, scale = 0;
  for (let j = 0; j < 3; j++) {
    const kk = k + j;
    if (kk < 0 || kk > 22) return fallback(buf, at, v);
    const p = POW10[kk], ph = POW10_HI[kk], pl = POW10_LO[kk];
    // S = v·10^kk exactly, as sh + sl (twoProduct).
    const sh = v * p;
    const sl = vl * pl - (((sh - vh * ph) - vl * ph) - vh * pl);
    if (j === 0) {
      if (sh > 1e15 || (sh === 1e15 && sl >= 0)) {
        k--;
        j = -1;
        continue;
      }
      if (sh < 1e14) {
        k++;
        j = -1;
        continue;
      }
    }
    // The integer nearest to S: dh + dl exactly (above 2^53, dh = sh is an even integer), g = S − (dh + dl).
    let dh: number, dl: number, g: number;
    if (sh >= TWO_53) {
      dh = sh;
      dl = Math.round(sl);
      g = sl - dl;
    } else {
      dh = Math.round(sh);
      dl = 0;
      g = sh - dh + sl; // sh − dh is exact
      if (g > 0.5) {
        dh++;
        g -= 1;
      } else if (g < -0.5) {
        dh--;
        g += 1;
      }
    }
    if (g === 0.5 || g === -0.5) return fallback(buf, at, v); // a tie between two candidates
    if (j === 2) {
      // 17 digits: the interval reaches more than half a unit on either side (unless v is a power of two), so
      // the nearest integer reads back.
      if (pow2) return fallback(buf, at, v);
      hi = dh;
      lo = dl;
      scale = kk;
      break;
    }
    // The candidate reads back iff it lies inside v's rounding interval scaled by 10^kk: half-width h (exact),
    // halved below v when v is a power of two. A candidate on the edge is left to String (ties to even).
    const h = half * p;
    const below = pow2 ? h / 2 : h;
    let a = g < 0 ? -g : g;
    let w = g > 0 ? below : h;
    if (a < w) {
      hi = dh;
      lo = dl;
      scale = kk;
      break;
    }
    if (a === w) return fallback(buf, at, v);
    if (j === 1) {
      // 16 digits: a lopsided interval may hold the nearest candidate's other neighbour instead.
      const step = g > 0 ? 1 : -1;
      const g2 = g - step;
      a = g2 < 0 ? -g2 : g2;
      w = g2 > 0 ? below : h;
      if (a < w) {
        hi = dh;
        lo = dl + step;
        scale = kk;
        break;
      }
      if (a === w) return fallback(buf, at, v);
    }
    // 15 digits: the interval is narrower than a unit, so no other candidate can be in it.
  }
  if (hi < 0) return fallback(buf, at, v);
  // hi + lo = q·10^8 + r: q·1e8 is exact (q < 1e9), and so is the subtraction (Sterbenz).
  let q = Math.floor(hi * 1e-8);
  let r = hi - q * 1e8 + lo;
  if (r < 0) {
    q--;
    r += 1e8;
  } else if (r >= 1e8) {
    q++;
    r -= 1e8;
  }
  return writeScaled(buf, at, q, r, scale);
}

const scratch = new Uint8Array(32);

const one = new Float64Array(1);

/** String(x) for finite x, by writeDouble (for tests and small uses). */
export function formatDouble(x: number): string {
  one[0] = x;
  const n = writeDouble(scratch, 0, one, 0);
  return String.fromCharCode(...scratch.subarray(0, n));
}
