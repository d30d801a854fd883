// The one-pass reading of the usual record line (record-scan.ts) and its number reader (number-read.ts), checked
// against JSON.parse (V8's, outside this project) as the reference: every number must come out bit-identical,
// every usual line as the full reading gives it, and every other line must be left to the full reading.
import { describe, expect, it } from 'vitest';
import { readJsonNumber } from '../../../lib/ingest/number-read';
import { ParticleScratch } from '../../../lib/ingest/particle-scratch';
import { parseRecordBytesInto, parseRecordLineInto, parseRecordObjectInto } from '../../../lib/ingest/record';
import { scanRecordLine } from '../../../lib/ingest/record-scan';
import type { RecordContext } from '../../../lib/ingest/types';
import { Rng } from '../../../lib/physics/random';

const out = new Float64Array(1);

const bytes = (s: string) => new TextEncoder().encode(s);

/** The reader's value of s (which must be one whole JSON number), or the position it stopped at. */
function read(s: string): number | string {
  const b = bytes(s);
  const end = readJsonNumber(b, 0, b.length, out, 0);
  return end === b.length ? out[0] : `stopped at ${end}`;
}

function expectSameAsJson(texts: string[]): void {
  const wrong = texts.filter((s) => !Object.is(read(s), JSON.parse(s)));
  expect(wrong.slice(0, 5)).toEqual([]);
}

describe('readJsonNumber', () => {
  const rng = new Rng(20261202);
  const bits = new Float64Array(1);
  const words = new Uint32Array(bits.buffer);

  it('reads the shortest text of random doubles of every magnitude as JSON.parse does', () => {
    const texts: string[] = [];
    while (texts.length < 60000) {
      words[0] = Math.floor(rng.next() * 2 ** 32);
      words[1] = Math.floor(rng.next() * 2 ** 32);
      if (!Number.isFinite(bits[0])) continue;
      texts.push(String(bits[0]).replace('e+', 'e'), bits[0].toExponential(Math.floor(rng.next() * 20)));
      // Momenta as files hold them: 1e-4 … 1e4 GeV, 16 or 17 significant digits.
      texts.push(String((rng.next() - 0.5) * 10 ** (Math.floor(rng.next() * 9) - 4)));
    }
    expectSameAsJson(texts);
  });

  it('reads random decimal texts of 1 to 24 digits, with and without exponents, as JSON.parse does', () => {
    const texts: string[] = [];
    for (let t = 0; t < 100000; t++) {
      const nd = 1 + Math.floor(rng.next() * 24);
      let d = String(1 + Math.floor(rng.next() * 9));
      for (let j = 1; j < nd; j++) d += Math.floor(rng.next() * 10);
      const point = Math.floor(rng.next() * (nd + 1));
      let s = point === 0 ? `0.${'0'.repeat(Math.floor(rng.next() * 5))}${d}` : point === nd ? d : `${d.slice(0, point)}.${d.slice(point)}`;
      if (rng.next() < 0.5) s += `${rng.next() < 0.5 ? 'e' : 'E-'}${Math.floor(rng.next() * 30)}`;
      texts.push(rng.next() < 0.5 ? `-${s}` : s);
    }
    expectSameAsJson(texts);
  });

  it('stops at the first byte after the number, whatever follows it (the reader takes four digits at once)', () => {
    // Every byte a number can be followed by in a file, and the ones next to the digits in ASCII; the reader must
    // stop right before it and read the same value as JSON.parse of the number alone.
    const after = [',', ']', '}', ' ', '\n', '/', '*', '+', '-', ':', ';', '<', '?', 'x', '\u00e9'];
    const wrong: string[] = [];
    for (let t = 0; t < 20000; t++) {
      const nd = 1 + Math.floor(rng.next() * 18);
      let d = String(1 + Math.floor(rng.next() * 9));
      for (let j = 1; j < nd; j++) d += Math.floor(rng.next() * 10);
      const point = 1 + Math.floor(rng.next() * nd);
      const s = point === nd ? d : `${d.slice(0, point)}.${d.slice(point)}`;
      const tail = after[t % after.length] + String(Math.floor(rng.next() * 1e6));
      const b = bytes(s + tail);
      const end = readJsonNumber(b, 0, b.length, out, 0);
      if (end !== bytes(s).length || !Object.is(out[0], JSON.parse(s))) wrong.push(`${s + tail}: end ${end}, ${out[0]}`);
    }
    expect(wrong.slice(0, 5)).toEqual([]);
  });

  it('rounds exact halfway cases to even, and reads zeros, extremes and long texts', () => {
    // 2^53 + 1 and 2^53 + 3 lie exactly halfway between two doubles (ties to even: 2^53 and 2^53 + 4).
    expect(read('9007199254740993')).toBe(9007199254740992);
    expect(read('9007199254740995')).toBe(9007199254740996);
    expectSameAsJson([
      '0', '-0', '0.0', '-0.0e5', '0e-7', '1', '1E+2', '1e-0', '0.1', '0.30000000000000004', '9007199254740993.0000000001',
      '123456789012345678901234567890', '1.7976931348623157e308', '2.2250738585072014e-308', '5e-324', '1e400', '-1e-400',
      '4.9406564584124654e-324', '1.00000000000000011102230246251565404236316680908203125',
    ]);
  });

  it('refuses texts that are not JSON numbers', () => {
    for (const s of ['01', '-01', '1.', '.5', '-', '+1', '1e', '1e+', '--1', '-a', '1.e3', '', 'NaN', 'Infinity']) {
      expect(readJsonNumber(bytes(s), 0, s.length, out, 0), s).toBe(-1);
    }
    // A number ends where its grammar ends, or at the end given; the caller checks what follows.
    expect(readJsonNumber(bytes('12.5,'), 0, 5, out, 0)).toBe(4);
    expect(out[0]).toBe(12.5);
    expect(readJsonNumber(bytes('[12.5e3]'), 1, 5, out, 0)).toBe(5);
    expect(out[0]).toBe(12.5);
  });
});

describe('scanRecordLine', () => {
  const ctx: RecordContext = { momentum: 'px,py,pz,E', energyUnit: 'GeV', where: 'line' };

  function full(text: string, c = ctx) {
    const scratch = new ParticleScratch();
    const rec = parseRecordObjectInto(JSON.parse(text), 9, c, scratch);
    return { rec, particles: Array.from(scratch.buf.subarray(0, 4 * rec.n)) };
  }
  function scanned(text: string, c = ctx) {
    const scratch = new ParticleScratch();
    scratch.buf = new Float64Array(4); // grows while reading
    // The line sits between other bytes, as in a batch: nothing outside [start, end) may be read.
    const b = bytes(`1,2]${text}[3,`);
    const rec = scanRecordLine(b, 4, b.length - 3, 9, c, scratch);
    return rec && { rec, particles: Array.from(scratch.buf.subarray(0, 4 * rec.n)) };
  }

  it('reads usual lines exactly as JSON.parse and the full checks do', () => {
    const ps = [[0.27382547189147083, -1.2542629934481224, 0.37324038697215917, 1.3369608940642799], [-49.342269460739985, -6.061611074433585, 63.08063341921644, 80.31543436303843], [1, 0, 0, 1.5]];
    const lines = [
      JSON.stringify({ id: 0, particles: ps }),
      JSON.stringify({ particles: ps, weight: 2.5e-3, id: 'event 7' }),
      JSON.stringify({ id: null, weight: 1, particles: ps }),
      JSON.stringify({ id: -12.5, particles: ps.slice(0, 1) }),
      JSON.stringify({ id: 3, weight: 0.5, particles: ps }, null, 2),
      ` \t{ "id" : 1 ,"particles":[ [ 1 , 0 , 0 , 2 ] ,[0,1,0,2]] }\r`,
    ];
    for (const line of lines) expect(scanned(line), line).toEqual(full(line));
    const mev: RecordContext = { ...ctx, energyUnit: 'MeV' };
    expect(scanned(lines[0], mev)).toEqual(full(lines[0], mev));
  });

  it('leaves every other line to the full reading', () => {
    const p = '[[1,0,0,2]]';
    for (const line of [
      `{"id":1,"particles":${p},"pid":[211]}`, // another field
      `{"id":1,"id":2,"particles":${p}}`, // a repeated key
      `{"id":"a\\"b","particles":${p}}`, // an escape
      `{"id":"é","particles":${p}}`, // not ASCII
      `{"id":1,"particles":[[1,0,0,2]`, // cut short (the bytes after it must not complete it)
      `{"id":true,"particles":${p}}`,
      `{"weight":null,"particles":${p}}`,
      `{"id":1,"particles":[]}`, // no particles
      `{"id":1}`,
      `{"id":1,"particles":[[1,0,0,2,5]]}`,
      `{"id":1,"particles":[[1,0,0]]}`,
      `{"id":1,"particles":[[1,0,0,NaN]]}`,
      `{"id":1,"particles":[[1,0,0,0.5]]}`, // E < |p|: the full reading names the problem
      `{"id":1,"particles":[[1e400,0,0,2]]}`,
      `{"id":1,"particles":${p}} x`,
      `{"id":1,"particles":${p},}`,
      `[1,2]`,
      ``,
    ]) {
      expect(scanned(line), line).toBeNull();
    }
    expect(scanned(`{"id":1,"particles":${p}}`, { ...ctx, momentum: 'pt,y,phi,m' } as RecordContext)).toBeNull();
  });

  it('parseRecordBytesInto gives any line the string reading\'s record or message (non-ASCII, pid, bad particle)', () => {
    const lines = [
      '{"id":"évènement 7","particles":[[1,0,0,2]]}',
      '{"id":1,"particles":[[1,0,0,2],[0,1,0,2]],"pid":[211,-211]}',
      '{"id":1,"particles":[[1,0,0,2],[1,0,0,0.5]]}',
      '{"id":1,"particles":[[1,0,0,NaN]]}',
      '{"id":1,"particles":[[1,0,0,2]]',
    ];
    const outcome = (f: (scratch: ParticleScratch) => { n: number }) => {
      const scratch = new ParticleScratch();
      try {
        const rec = f(scratch);
        return { rec, particles: Array.from(scratch.buf.subarray(0, 4 * rec.n)) };
      } catch (e) {
        return { error: (e as Error).message };
      }
    };
    for (const line of lines) {
      const b = bytes(`x\n${line}\n`);
      const fromBytes = outcome((sc) => parseRecordBytesInto(b, 2, b.length - 1, 5, ctx, sc));
      expect(fromBytes, line).toEqual(outcome((sc) => parseRecordLineInto(line, 5, ctx, sc)));
    }
  });
});
