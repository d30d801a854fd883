// The jet lines of the splitfield-declusterings export (DESIGN.md "Export format") written straight as UTF-8
// bytes: the same text JSON.stringify gives for the object {rec, jet, pt, y, phi, m, n, weight, flavour?,
// primary, all?, sd, mult} (e+e- jets: E and theta in place of pt and y; numbers as String(x) writes them, by
// number-text.ts; NaN and ±Infinity as null), without building the objects and strings first.

import { SPLIT_STRIDE, type RecordResult } from '../physics/types';
import { writeDouble, writeInteger } from './number-text';
import { flavourName } from '../physics/flavour';
import type { RecordMeta } from './pipeline/sink';
import type { JetLineStyle } from './types';

const ascii = (s: string) => Uint8Array.from(s, (c) => c.charCodeAt(0));
const REC = ascii('{"rec":');
const JET = ascii(',"jet":');
const PT = ascii(',"pt":');
const Y = ascii(',"y":');
const E = ascii(',"E":');
const THETA = ascii(',"theta":');
const FLAVOUR = ascii(',"flavour":');
const FLAVOUR_NAMES = { b: ascii('"b"'), c: ascii('"c"'), light: ascii('"light"') };
const PHI = ascii(',"phi":');
const M = ascii(',"m":');
const N = ascii(',"n":');
const WEIGHT = ascii(',"weight":');
const PRIMARY = ascii(',"primary":[');
const ALL = ascii('],"all":[');
const SD = ascii('],"sd":[');
const MULT = ascii('],"mult":');
const NULL = ascii('null');
const utf8 = new TextEncoder();

let buf = new Uint8Array(1 << 20);
const one = new Float64Array(1);

function ensure(at: number, more: number): void {
  if (at + more <= buf.length) return;
  const grown = new Uint8Array(Math.max(2 * buf.length, at + more));
  grown.set(buf.subarray(0, at));
  buf = grown;
}

function put(at: number, bytes: Uint8Array): number {
  buf.set(bytes, at);
  return at + bytes.length;
}

/** src[i] as JSON: String(x) for a finite number, null otherwise. */
function num(at: number, src: Float64Array, i: number): number {
  const x = src[i];
  return x - x === 0 ? writeDouble(buf, at, src, i) : put(at, NULL);
}

function value(at: number, x: number): number {
  one[0] = x;
  return num(at, one, 0);
}

function int(at: number, n: number): number {
  if (n >= 0 && n < 2147483648 && n === Math.floor(n)) return writeInteger(buf, at, n);
  return value(at, n);
}

/** The record id as JSON (a string with JSON.stringify's escapes, or a number); room for it is ensured. */
function id(at: number, v: string | number): number {
  if (typeof v === 'number') return value(at, v);
  const text = JSON.stringify(v);
  ensure(at, 3 * text.length);
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c >= 128) return at + utf8.encodeInto(text.slice(i), buf.subarray(at)).written;
    buf[at++] = c;
  }
  return at;
}

/** Splittings as rows: the listed fields of each (offsets within SPLIT_STRIDE). */
function rows(at: number, a: Float64Array, fields: readonly number[]): number {
  const n = a.length / SPLIT_STRIDE;
  for (let k = 0, base = 0; k < n; k++, base += SPLIT_STRIDE) {
    if (k > 0) buf[at++] = 44;
    buf[at++] = 91;
    for (let q = 0; q < fields.length; q++) {
      if (q > 0) buf[at++] = 44;
      at = num(at, a, base + fields[q]);
    }
    buf[at++] = 93;
  }
  return at;
}

/** "primary" columns: lnInvDelta, lnKt, z, delta, kt, psi, m; "all": generation, lnInvDelta, lnKt, z. */
const PRIMARY_FIELDS = [0, 1, 2, 3, 4, 5, 6] as const;
const ALL_FIELDS = [8, 0, 1, 2] as const;

/** The export lines (each with its newline) of consecutive records' jets, as UTF-8 bytes (a fresh copy). */
export function encodeJets(records: RecordMeta[], results: RecordResult[], style: JetLineStyle): Uint8Array {
  const { fullTree, ee, flavour } = style;
  let at = 0;
  for (let r = 0; r < records.length; r++) {
    const jets = results[r].jets;
    const rec = records[r];
    for (let j = 0; j < jets.length; j++) {
      const jt = jets[j];
      const splits = jt.primary.length + (fullTree && jt.all ? jt.all.length : 0);
      ensure(at, 512 + 26 * splits);
      at = put(at, REC);
      at = id(at, rec.id);
      ensure(at, 512 + 26 * splits);
      at = put(at, JET);
      at = int(at, j);
      if (ee) {
        at = put(at, E);
        at = value(at, jt.E ?? NaN);
        at = put(at, THETA);
        at = value(at, jt.theta ?? NaN);
      } else {
        at = put(at, PT);
        at = value(at, jt.pt);
        at = put(at, Y);
        at = value(at, jt.y);
      }
      at = put(at, PHI);
      at = value(at, jt.phi);
      at = put(at, M);
      at = value(at, jt.m);
      at = put(at, N);
      at = int(at, jt.n);
      at = put(at, WEIGHT);
      at = value(at, rec.weight);
      if (flavour) {
        at = put(at, FLAVOUR);
        const name = flavourName(jt.flavour);
        at = put(at, name === null ? NULL : FLAVOUR_NAMES[name]);
      }
      at = put(at, PRIMARY);
      at = rows(at, jt.primary, PRIMARY_FIELDS);
      if (fullTree) {
        at = put(at, ALL);
        if (jt.all) at = rows(at, jt.all, ALL_FIELDS);
      }
      at = put(at, SD);
      at = value(at, jt.softDrop.mg);
      buf[at++] = 44;
      at = value(at, jt.softDrop.zg);
      buf[at++] = 44;
      at = value(at, jt.softDrop.Rg);
      at = put(at, MULT);
      at = int(at, jt.multiplicity);
      buf[at++] = 125;
      buf[at++] = 10;
    }
  }
  return buf.slice(0, at);
}
