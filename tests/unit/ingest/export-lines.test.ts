// The export's byte writer against its definitions: every number as ECMA-262 Number::toString writes it (String(x),
// which JSON.stringify uses), and every jet line as JSON.stringify writes the jet's object (DESIGN.md "Export
// format"), NaN and ±Infinity as null, ids with JSON's escapes and UTF-8.
import { describe, expect, it } from 'vitest';
import { encodeJets } from '@/lib/ingest/export-lines';
import { formatDouble } from '@/lib/ingest/number-text';
import type { RecordMeta } from '@/lib/ingest/pipeline/sink';
import type { JetLineStyle } from '@/lib/ingest/types';
import { Rng } from '@/lib/physics/random';
import { SPLIT_STRIDE, type JetResult, type RecordResult } from '@/lib/physics/types';

describe('shortest round-trip number text (Number::toString)', () => {
  const rng = new Rng(2026);
  const bits = new Float64Array(1);
  const words = new Uint32Array(bits.buffer);
  const mismatches: string[] = [];
  const check = (x: number) => {
    const ours = formatDouble(x);
    if (ours !== String(x) && mismatches.length < 10) mismatches.push(`${String(x)} written ${ours}`);
  };

  it('random doubles of every magnitude, random bit patterns, short decimals and angles', () => {
    for (let i = 0; i < 150_000; i++) {
      check((rng.next() - 0.5) * Math.exp(40 * rng.next() - 20));
      words[0] = (rng.next() * 2 ** 32) >>> 0;
      words[1] = (rng.next() * 2 ** 32) >>> 0;
      if (Number.isFinite(bits[0])) check(bits[0]);
      check(Math.round(rng.next() * 1e6) / 1000);
      check(Number((rng.next() * 100).toPrecision(1 + rng.int(0, 16))));
      check(Math.log(rng.next() * 1000));
      check(Math.atan2(rng.next() - 0.5, rng.next() - 0.5));
    }
    expect(mismatches).toEqual([]);
  });

  it('edges: powers of two and ten, their neighbours, the ends of the fast range, integers, zero', () => {
    for (let e = -330; e < 310; e++) {
      for (const m of [1, 2, 5, 9.999999999999998, 1.0000000000000002, 0.9999999999999999]) check(m * Math.pow(10, e));
      check(Math.pow(2, e));
      check(Math.pow(2, e) * (1 + 2 ** -52));
      check(Math.pow(2, e) * (1 - 2 ** -53));
      check(Number(`1e${e}`));
    }
    for (const x of [1e-6, 1e-7, 9.99999999999999e-7, 1e15, 999999999999999.9, 1e14, 0.1, 0.2, 0.3, 1 / 3, 2 / 3, 5e-324, 1.7976931348623157e308, 2 ** 53, 2 ** 31, 2 ** 31 - 1, -(2 ** 31), 123456789012345680, 0, -0, 1, -1]) check(x);
    expect(mismatches).toEqual([]);
    expect(formatDouble(-0)).toBe('0');
  });
});

/**
 * The definition: JSON.stringify of the jet's object (the export's column order, DESIGN.md "Export format"; e+e-
 * jets carry E and theta in place of pt and y, tagged jets their flavour after the weight).
 */
function reference(records: RecordMeta[], results: RecordResult[], style: JetLineStyle): string {
  const rows = (a: Float64Array, fields: number[]) => {
    const out: number[][] = [];
    for (let i = 0; i < a.length; i += SPLIT_STRIDE) out.push(fields.map((f) => a[i + f]));
    return out;
  };
  // Flavour codes (lib/physics/particle-id.ts): 5 b, 4 c, 0 light; a negative code is no tag.
  const flavourName = (f: number | undefined) => (f === undefined || f < 0 ? null : f === 5 ? 'b' : f === 4 ? 'c' : 'light');
  let text = '';
  records.forEach((rec, r) =>
    results[r].jets.forEach((jt, j) => {
      const kinematics = style.ee ? { E: jt.E, theta: jt.theta } : { pt: jt.pt, y: jt.y };
      const o: Record<string, unknown> = { rec: rec.id, jet: j, ...kinematics, phi: jt.phi, m: jt.m, n: jt.n, weight: rec.weight };
      if (style.flavour) o.flavour = flavourName(jt.flavour);
      o.primary = rows(jt.primary, [0, 1, 2, 3, 4, 5, 6]);
      if (style.fullTree) o.all = jt.all ? rows(jt.all, [8, 0, 1, 2]) : [];
      o.sd = [jt.softDrop.mg, jt.softDrop.zg, jt.softDrop.Rg];
      o.mult = jt.multiplicity;
      text += JSON.stringify(o) + '\n';
    }),
  );
  return text;
}

describe('export jet lines as bytes', () => {
  it('are the UTF-8 of JSON.stringify of each jet (nulls, escapes, ids, with and without the full tree, e+e- and flavour lines)', () => {
    const rng = new Rng(7);
    const odd = [NaN, Infinity, -Infinity, -0, 0, 1e300, 1e-300, 2 ** 53 + 2];
    const value = () => (rng.next() < 0.05 ? odd[rng.int(0, odd.length - 1)] : (rng.next() - 0.3) * Math.exp(12 * rng.next() - 4));
    const splittings = (n: number) => Float64Array.from({ length: n * SPLIT_STRIDE }, (_, i) => (i % SPLIT_STRIDE === 8 ? rng.int(1, 5) : value()));
    const ids: (string | number)[] = [7, 'e1', 'quote " and \\ backslash', 'tab\tnew\nline', 'Tallis–Larkspur ✓', 'ctrl \u0001', 12.5, -3, 1e21];
    const records: RecordMeta[] = [];
    const results: RecordResult[] = [];
    for (let r = 0; r < 60; r++) {
      records.push({ line: r + 2, id: ids[r % ids.length], weight: r % 4 === 0 ? 1 : value(), nParticles: 10 });
      const jets: JetResult[] = [];
      for (let j = rng.int(0, 3); j > 0; j--) {
        const np = rng.int(0, 6);
        jets.push({
          pt: value(), y: value(), phi: value(), m: value(), n: rng.int(1, 300),
          primary: splittings(np), all: rng.next() < 0.8 ? splittings(rng.int(np, 12)) : null,
          softDrop: { mg: value(), zg: value(), Rg: value() }, multiplicity: rng.int(0, 9),
          E: value(), theta: value(), flavour: [-1, 0, 4, 5][rng.int(0, 3)],
        });
      }
      results.push({ jets, rejected: { pt: 0, y: 0, rank: 0 } });
    }
    for (const fullTree of [false, true]) {
      for (const [ee, flavour] of [[false, false], [true, false], [false, true], [true, true]]) {
        const style = { fullTree, ee, flavour };
        expect(new TextDecoder().decode(encodeJets(records, results, style))).toBe(reference(records, results, style));
      }
    }
  });
});
