// Reads a JSON number from UTF-8 bytes as JSON.parse reads it (the double nearest to the decimal value, ties to
// even: ECMA-262 and IEEE 754 round to nearest), without making a string: the reading half of number-text.ts.
//
// Exact arithmetic decides every case it answers. The significant digits M (at most 19) and the decimal exponent
// E give the value M·10^E, with 10^|E| an exact double for |E| ≤ 22:
//  - M below 2^53 (exact as a double): one correctly rounded product or quotient gives the nearest double
//    (W. D. Clinger, "How to read floating point numbers accurately", PLDI 1990, the fast path);
//  - larger M (16 to 19 digits): M held exactly as a double-double, scaled by 10^E with Dekker's twoProduct
//    (T. J. Dekker, Numer. Math. 18 (1971) 224; Veltkamp's splitting, as number-text.ts) to within about 2^-100;
//    the double nearest to that is the answer unless the value lies within 2^-90 (relative) of a point halfway
//    between two doubles.
// Anything else — more than 19 significant digits, |E| > 22, the near-halfway cases — is read by Number() of the
// number's text, which rounds the same way; so the result is always JSON.parse's. Bytes rather than a string:
// charCodeAt measured three times slower a character than reading a Uint8Array. Digits after the point are taken
// four at a time when four follow (one 32-bit read, checked and combined as a word): 55 → 44 ns a number on the
// benchmark files.

import { POW10, POW10_HI, POW10_LO, SPLITTER, TWO_53 } from './number-text';

/** 2^-90: the relative margin to a halfway point below which the double-double answer is not trusted. */
const HALFWAY_MARGIN = Math.pow(2, -90);

/**
 * Reads the JSON number that starts at text[i] (and ends before text[end]) into out[k]; returns the position
 * after it, or −1 when the text there is not a JSON number (-?(0|[1-9][0-9]*)(.[0-9]+)?([eE][+-]?[0-9]+)?), for the caller to leave to
 * JSON.parse. The value is stored, not returned: a double returned from a call V8 does not inline is boxed.
 */
export function readJsonNumber(text: Uint8Array, i: number, end: number, out: Float64Array, k: number): number {
  const start = i;
  let c = i < end ? text[i] : 0;
  let neg = false;
  if (c === 45) {
    neg = true;
    c = ++i < end ? text[i] : 0;
  }
  // Significant digits: the first 15 in hi, up to 4 more in lo; the value is (hi·10^nLo + lo)·10^dexp. A non-zero
  // digit beyond the 19th sets `inexact`.
  let hi = 0, lo = 0, nHi = 0, nLo = 0, dexp = 0;
  let inexact = false;
  if (c === 48) {
    c = ++i < end ? text[i] : 0;
    if (c >= 48 && c <= 57) return -1; // a leading zero
  } else if (c >= 49 && c <= 57) {
    do {
      const d = c - 48;
      if (nHi < 15) {
        hi = hi * 10 + d;
        nHi++;
      } else if (nLo < 4) {
        lo = lo * 10 + d;
        nLo++;
      } else {
        dexp++;
        if (d !== 0) inexact = true;
      }
      c = ++i < end ? text[i] : 0;
    } while (c >= 48 && c <= 57);
  } else return -1;
  if (c === 46) {
    c = ++i < end ? text[i] : 0;
    if (!(c >= 48 && c <= 57)) return -1;
    const view = viewOf(text);
    do {
      const d = c - 48;
      if (nHi === 0) {
        dexp--;
        if (d !== 0) {
          hi = d;
          nHi = 1;
        }
      } else if (nHi <= 11 && i + 4 <= end) {
        // Four digits at once when they are four (SWAR, the first digit in the lowest byte).
        const x = view.getUint32(i, true);
        if ((x & 0xf0f0f0f0) === 0x30303030 && ((x + 0x06060606) & 0xf0f0f0f0) === 0x30303030) {
          const t = ((x - 0x30303030) * 10 + ((x - 0x30303030) >>> 8)) & 0x00ff00ff;
          hi = hi * 1e4 + ((t & 0xff) * 100 + (t >>> 16));
          nHi += 4;
          dexp -= 4;
          i += 3;
        } else {
          hi = hi * 10 + d;
          nHi++;
          dexp--;
        }
      } else if (nHi < 15) {
        hi = hi * 10 + d;
        nHi++;
        dexp--;
      } else if (nLo < 4) {
        lo = lo * 10 + d;
        nLo++;
        dexp--;
      } else if (d !== 0) inexact = true;
      c = ++i < end ? text[i] : 0;
    } while (c >= 48 && c <= 57);
  }
  if (c === 101 || c === 69) {
    c = ++i < end ? text[i] : 0;
    let eneg = false;
    if (c === 43 || c === 45) {
      eneg = c === 45;
      c = ++i < end ? text[i] : 0;
    }
    if (!(c >= 48 && c <= 57)) return -1;
    let e = 0;
    do {
      if (e < 1e6) e = e * 10 + (c - 48);
      c = ++i < end ? text[i] : 0;
    } while (c >= 48 && c <= 57);
    dexp += eneg ? -e : e;
  }

  if (hi === 0) {
    out[k] = neg ? -0 : 0;
    return i;
  }
  if (inexact || dexp > 22 || dexp < -22) {
    out[k] = numberOf(text, start, i);
    return i;
  }
  // Clinger's fast path whenever M is exact as a double: below 2^53 every step of hi·10^nLo + lo is exact (and a
  // sum at or above 2^53 means M is too).
  const m = nLo === 0 ? hi : hi * POW10[nLo] + lo;
  if (m < TWO_53) {
    const v = dexp >= 0 ? m * POW10[dexp] : m / POW10[-dexp];
    out[k] = neg ? -v : v;
    return i;
  }
  // M = hi·10^nLo + lo exactly as s + se: hi·10^nLo by twoProduct (p + pe), then lo added (twoSum); the
  // remainders are integers below 2^11, so their sum is exact.
  const P = POW10[nLo];
  const p = hi * P;
  let t = SPLITTER * hi;
  const hh = t - (t - hi), hl = hi - hh;
  const pe = ((hh * POW10_HI[nLo] - p) + hh * POW10_LO[nLo] + hl * POW10_HI[nLo]) + hl * POW10_LO[nLo];
  const s1 = p + lo;
  const bb = s1 - p;
  const r = (p - (s1 - bb)) + (lo - bb) + pe;
  const s = s1 + r;
  const se = r - (s - s1);
  // x + err ≈ M·10^dexp (to about 2^-100), x the double nearest to it.
  let x: number, err: number;
  t = SPLITTER * s;
  const sh = t - (t - s), sl = s - sh;
  if (dexp >= 0) {
    const Q = POW10[dexp], qh = POW10_HI[dexp], ql = POW10_LO[dexp];
    const a = s * Q;
    const c2 = (((sh * qh - a) + sh * ql + sl * qh) + sl * ql) + se * Q;
    x = a + c2;
    err = c2 - (x - a);
  } else {
    const Q = POW10[-dexp], qh = POW10_HI[-dexp], ql = POW10_LO[-dexp];
    const q1 = s / Q;
    t = SPLITTER * q1;
    const q1h = t - (t - q1), q1l = q1 - q1h;
    const tp = q1 * Q;
    const te = ((q1h * qh - tp) + q1h * ql + q1l * qh) + q1l * ql;
    const q2 = ((s - tp) - te + se) / Q;
    x = q1 + q2;
    err = q2 - (x - q1);
  }
  // x is the nearest double to every value within x·2^-90 of x + err (so to the true value) iff the sums at both
  // ends of that range round to x: the hardware's own rounding decides, including the narrower gap below a power
  // of two.
  const margin = x * HALFWAY_MARGIN;
  out[k] = x + (err + margin) === x && x + (err - margin) === x ? (neg ? -x : x) : numberOf(text, start, i);
  return i;
}

let viewed: Uint8Array | null = null;
let view: DataView<ArrayBufferLike> = new DataView(new ArrayBuffer(0));

/** A DataView of the bytes (kept while the same bytes are read). */
function viewOf(text: Uint8Array): DataView<ArrayBufferLike> {
  if (text !== viewed) {
    viewed = text;
    view = new DataView(text.buffer, text.byteOffset, text.byteLength);
  }
  return view;
}

/** The number written in text[start, end) (ASCII), read by Number(): the rare cases the arithmetic leaves. */
function numberOf(text: Uint8Array, start: number, end: number): number {
  return Number(String.fromCharCode.apply(null, text.subarray(start, end) as unknown as number[]));
}
