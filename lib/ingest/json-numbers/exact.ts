// Exact floating-point building blocks of the number reader and writer (parse.ts, format.ts): the exact product
// of two doubles as a sum of two doubles (Dekker's TwoProduct with Veltkamp's splitting, as no fused
// multiply-add is available in JavaScript), the powers of ten that are exact doubles, and the neighbours of a
// double. Source: T. J. Dekker, "A floating-point technique for extending the available precision",
// Numer. Math. 18 (1971) 224.

/** 10^k for k = 0..22: every one is an exact double (5^22 < 2^53). */
export const POW10 = Float64Array.from({ length: 23 }, (_, k) => Number(`1e${k}`));

const SPLITTER = 134217729; // 2^27 + 1

/** The low part of the last twoProduct: a·b = hi + PRODUCT_LOW[0] exactly (barring overflow and underflow). */
export const PRODUCT_LOW = new Float64Array(1);

/** hi = fl(a·b), returned; the exact error a·b − hi is left in PRODUCT_LOW[0]. */
export function twoProduct(a: number, b: number): number {
  const hi = a * b;
  let t = SPLITTER * a;
  const ah = t - (t - a), al = a - ah;
  t = SPLITTER * b;
  const bh = t - (t - b), bl = b - bh;
  PRODUCT_LOW[0] = al * bl - (((hi - ah * bh) - al * bh) - ah * bl);
  return hi;
}

/** A double and its two 32-bit words (u32[HI] holds the sign, exponent and top of the mantissa). */
export const f64 = new Float64Array(1);
export const u32 = new Uint32Array(f64.buffer);
/** Index of the high word of a double in u32 (the platform's byte order). */
export const HI = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1 ? 1 : 0;
export const LO = 1 - HI;

/** The next double above a finite positive x. */
export function nextUp(x: number): number {
  f64[0] = x;
  if (u32[LO] === 0xffffffff) {
    u32[LO] = 0;
    u32[HI]++;
  } else u32[LO]++;
  return f64[0];
}

/** The next double below a finite positive x. */
export function nextDown(x: number): number {
  f64[0] = x;
  if (u32[LO] === 0) {
    u32[LO] = 0xffffffff;
    u32[HI]--;
  } else u32[LO]--;
  return f64[0];
}

