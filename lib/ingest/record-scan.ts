// The fast reading of the usual record line, {"id":..,"weight":..,"particles":[[px,py,pz,E],...]} in any key
// order and with any JSON white space, from its UTF-8 bytes: one pass, numbers read straight into the particle
// buffer (number-read.ts), no string or object made. Anything else — other keys (pid, charge, tags), a repeated
// key, escapes or non-ASCII characters in the id, the pt,y,phi,m convention, a bad particle, text that is not
// JSON — returns null, and the caller reads the line with JSON.parse and the full checks (record.ts), which give
// the same record or name the problem. So this is only a shortcut: every line gets exactly the result and message
// it would get without it.

import { toGeV } from '../physics/fourvector';
import { readJsonNumber } from './number-read';
import { quickParticleProblem, type ParsedRecord, type ParticleScratch } from './particle-scratch';
import type { RecordContext } from './types';

/** The id or weight read from the text (a one-element buffer: see readJsonNumber). */
const value = new Float64Array(1);
/** The particle count of the last readParticles. */
const scanned = { n: 0 };

const KEY_ID = 1, KEY_WEIGHT = 2, KEY_PARTICLES = 4;

/** Position of the first byte at or after i that is not JSON white space (end at most). */
function skipSpace(b: Uint8Array, i: number, end: number): number {
  while (i < end) {
    const c = b[i];
    if (c !== 32 && c !== 9 && c !== 13 && c !== 10) return i;
    i++;
  }
  return end;
}

/** The byte at i, 0 from end on. */
function byteAt(b: Uint8Array, i: number, end: number): number {
  return i < end ? b[i] : 0;
}

/** Closing quote of a string of printable ASCII without escapes that opens at b[i] = '"'; −1 for any other. */
function stringEnd(b: Uint8Array, i: number, end: number): number {
  for (i++; i < end; i++) {
    const c = b[i];
    if (c === 34) return i;
    if (c === 92 || c < 32 || c > 126) return -1;
  }
  return -1;
}

/** Which of the three keys the string b[from, to) is (0 for none). */
function keyOf(b: Uint8Array, from: number, to: number): number {
  const n = to - from;
  if (n === 2 && asciiIs(b, from, 'id')) return KEY_ID;
  if (n === 6 && asciiIs(b, from, 'weight')) return KEY_WEIGHT;
  if (n === 9 && asciiIs(b, from, 'particles')) return KEY_PARTICLES;
  return 0;
}

function asciiIs(b: Uint8Array, at: number, word: string): boolean {
  for (let k = 0; k < word.length; k++) if (b[at + k] !== word.charCodeAt(k)) return false;
  return true;
}

/**
 * Reads the particles array that opens at b[i] = '[' into scratch (4 numbers a particle, scaled by k); returns
 * the position after it, or −1 when it is not an array of 4-number arrays. The count is left in scanned.n.
 */
function readParticles(b: Uint8Array, i: number, end: number, scratch: ParticleScratch, k: number): number {
  let buf: Float64Array = scratch.buf;
  let n = 0;
  i = skipSpace(b, i + 1, end);
  if (byteAt(b, i, end) === 93) {
    scanned.n = 0;
    return i + 1;
  }
  for (;;) {
    if (byteAt(b, i, end) !== 91) return -1;
    const at = 4 * n;
    if (buf.length < at + 4) buf = scratch.ensure(at + 4);
    for (let q = 0; q < 4; q++) {
      i = readJsonNumber(b, skipSpace(b, i + 1, end), end, buf, at + q);
      if (i < 0) return -1;
      i = skipSpace(b, i, end);
      if (byteAt(b, i, end) !== (q < 3 ? 44 : 93)) return -1;
    }
    if (k !== 1) {
      buf[at] *= k;
      buf[at + 1] *= k;
      buf[at + 2] *= k;
      buf[at + 3] *= k;
    }
    n++;
    i = skipSpace(b, i + 1, end);
    const c = byteAt(b, i, end);
    if (c === 93) break;
    if (c !== 44) return -1;
    i = skipSpace(b, i + 1, end);
  }
  scanned.n = n;
  return i + 1;
}

/**
 * The record of a usual line b[start, end) (see above), its particles in scratch; null when the line needs the
 * full reading.
 */
export function scanRecordLine(b: Uint8Array, start: number, end: number, line: number, ctx: RecordContext, scratch: ParticleScratch): ParsedRecord | null {
  if (ctx.momentum !== 'px,py,pz,E') return null;
  let i = skipSpace(b, start, end);
  if (byteAt(b, i, end) !== 123) return null;
  let id: string | number = line;
  let weight = 1;
  let n = -1;
  let seen = 0;
  i = skipSpace(b, i + 1, end);
  for (;;) {
    if (byteAt(b, i, end) !== 34) return null;
    const ke = stringEnd(b, i, end);
    if (ke < 0) return null;
    const key = keyOf(b, i + 1, ke);
    if (key === 0 || (seen & key) !== 0) return null;
    seen |= key;
    i = skipSpace(b, ke + 1, end);
    if (byteAt(b, i, end) !== 58) return null;
    i = skipSpace(b, i + 1, end);
    const c = byteAt(b, i, end);
    if (key === KEY_PARTICLES) {
      if (c !== 91) return null;
      i = readParticles(b, i, end, scratch, toGeV(ctx.energyUnit));
      if (i < 0) return null;
      n = scanned.n;
    } else if (key === KEY_ID && c === 34) {
      const e = stringEnd(b, i, end);
      if (e < 0) return null;
      id = String.fromCharCode.apply(null, b.subarray(i + 1, e) as unknown as number[]);
      i = e + 1;
    } else if (key === KEY_ID && c === 110) {
      if (!asciiIs(b, i, 'null') || i + 4 > end) return null;
      i += 4;
    } else {
      i = readJsonNumber(b, i, end, value, 0);
      if (i < 0) return null;
      const v = value[0];
      if (!Number.isFinite(v)) return null;
      if (key === KEY_ID) id = v;
      else weight = v;
    }
    i = skipSpace(b, i, end);
    const d = byteAt(b, i, end);
    if (d === 125) break;
    if (d !== 44) return null;
    i = skipSpace(b, i + 1, end);
  }
  if (skipSpace(b, i + 1, end) !== end || n <= 0) return null;
  const p = scratch.buf;
  for (let j = 0, at = 0; j < n; j++, at += 4) {
    if (quickParticleProblem(p[at], p[at + 1], p[at + 2], p[at + 3]) !== null) return null;
  }
  return { line, id, weight, n };
}
