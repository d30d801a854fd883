// The splitfield-particles reader: formats (JSON Lines plain and gzip, one document), conversions,
// and every kind of bad input with the exact line (record) and particle it names.
import { afterAll, describe, expect, it } from 'vitest';
import { openParticleFile } from '@/lib/ingest/reader';
import { HEADER, gz, jsonl, massless, readAll, readError, tempDir } from './helpers';

const t = tempDir();
afterAll(() => t.cleanup());

const good = [
  { id: 'e1', weight: 0.5, particles: [[1, 2, 3, 10], [4, 5, 6, 20]] },
  { id: 7, particles: [[10, 0, 0, 10.5]] },
  { particles: [massless(30, 0.3, 1), massless(25, -0.2, 4)], pid: [211, -211], charge: [1, -1] },
];

describe('splitfield-particles: layouts', () => {
  it('reads JSON Lines: header, ids (default = line number), weights, pid and charge', async () => {
    const f = t.file('good.jsonl', jsonl({ ...HEADER, generator: 'toy', seed: 3 }, good));
    const { records, header } = await readAll(f);
    expect(header).toMatchObject({ format: 'splitfield-particles', version: 1, content: 'events', layout: 'jsonl', gzip: false });
    expect((header as { metadata: object }).metadata).toEqual({ generator: 'toy', seed: 3 });
    expect((header as { sample: object }).sample).toEqual(HEADER.sample);
    expect(records.map((r) => [r.line, r.id, r.weight])).toEqual([
      [2, 'e1', 0.5],
      [3, 7, 1],
      [4, 4, 1],
    ]);
    expect(Array.from(records[0].particles)).toEqual([1, 2, 3, 10, 4, 5, 6, 20]);
    expect(Array.from(records[2].pid!)).toEqual([211, -211]);
    expect(Array.from(records[2].charge!)).toEqual([1, -1]);
  });

  it('gives identical records for plain, gzip, CRLF, one-line document and pretty-printed document', async () => {
    const text = jsonl(HEADER, good);
    const plain = await readAll(t.file('p.jsonl', text));
    const gzipped = await readAll(t.file('p.jsonl.gz', gz(text)));
    const crlf = await readAll(t.file('crlf.jsonl', text.replace(/\n/g, '\r\n')));
    const doc1 = await readAll(t.file('doc1.json', JSON.stringify({ ...HEADER, records: good })));
    const doc2 = await readAll(t.file('doc2.json', JSON.stringify({ ...HEADER, records: good }, null, 2)));
    const doc3 = await readAll(t.file('doc3.json.gz', gz(JSON.stringify({ ...HEADER, records: good }, null, 1))));
    expect((gzipped.header as { gzip: boolean }).gzip).toBe(true);
    expect((doc2.header as { layout: string }).layout).toBe('document');
    const key = (rs: typeof plain.records) => rs.map((r) => [Array.from(r.particles), r.weight, r.pid && Array.from(r.pid)]);
    for (const other of [gzipped, crlf, doc1, doc2, doc3]) expect(key(other.records)).toEqual(key(plain.records));
    // ids: as given; the default is the line (JSON Lines) or the record number (one document)
    expect(plain.records.map((r) => r.id)).toEqual(['e1', 7, 4]);
    expect(doc2.records.map((r) => r.id)).toEqual(['e1', 7, 3]);
  });

  it('reads a large gzip file in a stream, across chunk boundaries, with line numbers intact', async () => {
    const recs = [];
    for (let i = 0; i < 20000; i++) recs.push({ id: `r${i}`, particles: [massless(10 + (i % 50), 0.01 * (i % 100), 0.1 * (i % 60)), massless(5, 1, 2)] });
    const f = t.file('big.jsonl.gz', gz(jsonl(HEADER, recs)));
    const { records } = await readAll(f);
    expect(records.length).toBe(20000);
    expect(records[19999]).toMatchObject({ id: 'r19999', line: 20001 });
    expect(records.every((r, i) => r.line === i + 2)).toBe(true);
  });

  it('converts pt,y,phi,m and MeV/TeV to px,py,pz,E in GeV', async () => {
    const h = { ...HEADER, momentum: 'pt,y,phi,m', energyUnit: 'MeV' };
    const f = t.file('ptyphim.jsonl', jsonl(h, [{ particles: [[50000, 0.5, 1.0, 139.57]] }]));
    const [r] = (await readAll(f)).records;
    const mt = Math.hypot(50, 0.13957);
    const expected = [50 * Math.cos(1), 50 * Math.sin(1), mt * Math.sinh(0.5), mt * Math.cosh(0.5)];
    Array.from(r.particles).forEach((v, i) => expect(v).toBeCloseTo(expected[i], 12));
    const tev = await readAll(t.file('tev.jsonl', jsonl({ ...HEADER, energyUnit: 'TeV' }, [{ particles: [[0.001, 0, 0.002, 0.003]] }])));
    Array.from(tev.records[0].particles).forEach((v, i) => expect(v).toBeCloseTo([1, 0, 2, 3][i], 12));
  });

  it('reads lines longer than its 1 MiB read window, after a BOM, with CRLF, as strings and as bytes', async () => {
    // A 60 000-particle record (about 2.6 MB) makes the window grow twice and shrink back after it.
    const big = Array.from({ length: 60_000 }, (_, i) => [1 + i / 7, 2 - i / 9, 3 + i / 11, 1e4 + i / 3]);
    const records = [
      { id: 'a', particles: [[1, 2, 3, 10]] },
      { id: 'big', particles: big },
      { id: 'b', particles: [[4, 5, 6, 20]] },
      { id: 'big2', particles: big.slice(0, 30_000) },
      { id: 'last', particles: [[1, 1, 1, 5]] },
    ];
    const lines = [JSON.stringify(HEADER), ...records.map((r) => JSON.stringify(r))];
    const text = '\ufeff' + lines.join('\r\n'); // no line break after the last line
    for (const [name, content] of [['window.jsonl', Buffer.from(text)], ['window.jsonl.gz', gz(text)]] as const) {
      const file = t.file(name, content);
      const read = await readAll(file);
      expect(read.records.map((r) => [r.id, r.line, r.particles.length / 4])).toEqual([
        ['a', 2, 1], ['big', 3, 60_000], ['b', 4, 1], ['big2', 5, 30_000], ['last', 6, 1],
      ]);
      expect(Array.from(read.records[1].particles.subarray(4 * 59_999))).toEqual(big[59_999]);
      // The byte path (what the pipeline reads): every record line's bytes, CR removed, with its number.
      const reader = await openParticleFile(file);
      const seen: [number, string][] = [];
      const decoder = new TextDecoder();
      for await (const b of reader.raw!.rawBatches(1 << 16, 2)) {
        if (b.kind !== 'jsonl') throw new Error('expected JSON Lines batches');
        for (let i = 0; i < b.starts.length; i++) seen.push([b.lineNos[i], decoder.decode(b.bytes.subarray(b.starts[i], b.ends[i]))]);
      }
      reader.close();
      expect(seen).toEqual(lines.slice(1).map((l, i) => [i + 2, l]));
    }
  });

  it('reads a file of many windows (the next one read ahead) line for line, as strings and as bytes', async () => {
    // 4 000 records of 1 to 3 kB: about 8 MB, lines cut at every window's end.
    const records = Array.from({ length: 4000 }, (_, i) => ({
      id: `r${i}`,
      particles: Array.from({ length: 20 + (i % 50) }, (_, j) => [i + j / 3, j - i / 7, 1 + j / 11, 1e4 + i + j]),
    }));
    const lines = [JSON.stringify(HEADER), ...records.map((r) => JSON.stringify(r))];
    const file = t.file('windows.jsonl', lines.join('\n') + '\n');
    const read = await readAll(file);
    expect(read.records.map((r) => r.id)).toEqual(records.map((r) => r.id));
    expect(read.records.every((r, i) => r.line === i + 2 && r.particles.length === 4 * records[i].particles.length)).toBe(true);
    expect(Array.from(read.records[3999].particles.subarray(-4))).toEqual(records[3999].particles.at(-1));
    const reader = await openParticleFile(file);
    const decoder = new TextDecoder();
    let k = 0;
    const wrong: number[] = [];
    for await (const b of reader.raw!.rawBatches()) {
      if (b.kind !== 'jsonl') throw new Error('expected JSON Lines batches');
      for (let i = 0; i < b.starts.length; i++, k++) {
        if (b.lineNos[i] !== k + 2 || decoder.decode(b.bytes.subarray(b.starts[i], b.ends[i])) !== lines[k + 1]) wrong.push(k + 2);
      }
    }
    reader.close();
    expect([k, wrong.slice(0, 5)]).toEqual([4000, []]);

    // Batches of 64 KiB: a line that does not fit starts the next batch (no batch grows past the size), and the
    // buffers given back are filled again: two buffers serve every batch.
    const again = await openParticleFile(file);
    const buffers = new Set<ArrayBufferLike>();
    let lines2 = 0;
    for await (const b of again.raw!.rawBatches(1 << 16)) {
      if (b.kind !== 'jsonl') throw new Error('expected JSON Lines batches');
      expect(b.bytes.buffer.byteLength).toBe(1 << 16);
      expect(b.ends[b.ends.length - 1]).toBeLessThanOrEqual(1 << 16);
      lines2 += b.starts.length;
      buffers.add(b.bytes.buffer);
      again.raw!.reuse!(b.bytes.buffer);
    }
    again.close();
    expect([lines2, buffers.size]).toEqual([4000, 2]);
  });

  it('reads a stream in tiny chunks: gzip magic and multi-byte characters split across chunks', async () => {
    const { Readable } = await import('node:stream');
    const { openParticleStream } = await import('@/lib/ingest/reader');
    const recs = [{ id: 'Jet → ü', particles: [[1, 2, 3, 10]] }, { id: 'é', particles: [[4, 5, 6, 20]] }];
    const text = jsonl({ ...HEADER, sample: { name: 'Échantillon ✓' } }, recs);
    for (const bytes of [Buffer.from(text), gz(text)]) {
      const chunks = Array.from(bytes, (b) => Uint8Array.of(b)); // one byte a chunk
      const r = await openParticleStream(Readable.from(chunks), { bytesTotal: bytes.length });
      const got = [];
      for await (const rec of r.records()) got.push([rec.id, rec.line, Array.from(rec.particles)]);
      expect(got).toEqual([
        ['Jet → ü', 2, [1, 2, 3, 10]],
        ['é', 3, [4, 5, 6, 20]],
      ]);
      expect(r.header.sample.name).toBe('Échantillon ✓');
      expect(r.bytesRead).toBe(bytes.length);
    }
  });

  it('accepts blank lines between records and a missing final newline', async () => {
    const text = JSON.stringify(HEADER) + '\n\n' + JSON.stringify(good[0]) + '\n   \n' + JSON.stringify(good[1]);
    const { records } = await readAll(t.file('blank.jsonl', text));
    expect(records.map((r) => r.line)).toEqual([3, 5]);
  });
});

describe('splitfield-particles: bad input names the line and particle', () => {
  const rec = (particles: unknown) => ({ id: 'x', particles });
  const fine = rec([[1, 2, 3, 10]]);

  it('wrong header', async () => {
    const e = await readError(t.file('wrongfmt.jsonl', jsonl({ ...HEADER, format: 'other-particles' }, [fine])));
    expect(e.line).toBe(1);
    expect(e.message).toMatch(/^line 1: wrong header: not a splitfield-particles file \(format is "other-particles"\)/);
    const e2 = await readError(t.file('nofmt.jsonl', jsonl({ version: 1 }, [fine])));
    expect(e2.message).toMatch(/^line 1: wrong header: .*no "format" field/);
    const e3 = await readError(t.file('badcontent.jsonl', jsonl({ ...HEADER, content: 'hits', energyUnit: 'eV' }, [fine])));
    expect(e3.message).toMatch(/^line 1: wrong header: content: content must be "events" or "jets"; energyUnit: energyUnit must be/);
    const e4 = await readError(t.file('hdrjson.jsonl', '{"format": "splitfield-particles", version: 1}\n' + JSON.stringify(fine) + '\n'));
    expect(e4.message).toMatch(/^line 1: the header is not valid JSON/);
    const e5 = await readError(t.file('csv.txt', 'px,py,pz,E\n1,2,3,4\n'));
    expect(e5.message).toMatch(/^line 1: the header is not valid JSON/);
  });

  it('unknown format version', async () => {
    const e = await readError(t.file('v2.jsonl', jsonl({ ...HEADER, version: 2 }, [fine])));
    expect(e.line).toBe(1);
    expect(e.code).toBe('version');
    expect(e.message).toBe('line 1: unknown format version: version 2; this Splitfield reads splitfield-particles version 1');
  });

  it('non-numeric momentum', async () => {
    const f = t.file('nonnum.jsonl', jsonl(HEADER, [fine, fine, rec([[1, 2, 3, 10], [1, 2, 3, 10], [1, 2, 3, 10], [1, 2, '3.5', 10]])]));
    const e = await readError(f);
    expect([e.line, e.particle, e.field]).toEqual([4, 3, 'pz']);
    expect(e.message).toBe('line 4, particle 3: pz is not a number: "3.5"');
    const e2 = await readError(t.file('short.jsonl', jsonl(HEADER, [rec([[1, 2, 3]])])));
    expect(e2.message).toMatch(/^line 2, particle 0: a particle must be an array of 4 numbers \[px,py,pz,E\], found \[1,2,3\]/);
  });

  it('NaN and Infinity (not JSON numbers) are named with their particle', async () => {
    const lines = [JSON.stringify(fine), '{"id":"n","particles":[[1,2,3,10],[1,NaN,3,10]]}'];
    const e = await readError(t.file('nan.jsonl', jsonl(HEADER, lines)));
    expect(e.message).toBe('line 3, particle 1: py is not a number: NaN');
    const e2 = await readError(t.file('inf.jsonl', jsonl(HEADER, ['{"particles":[[1,2,3,-Infinity]]}'])));
    expect(e2.message).toBe('line 2, particle 0: E is not a number: -Infinity');
    const e3 = await readError(t.file('badjson.jsonl', jsonl(HEADER, [fine, fine, '{"particles":[[1,2,3,10]]']))); // cut line
    expect(e3.line).toBe(4);
    expect(e3.message).toMatch(/^line 4: not valid JSON: /);
  });

  it('E < |p| and E <= |pz| (no rapidity)', async () => {
    const e = await readError(t.file('ep.jsonl', jsonl(HEADER, [fine, rec([[1, 2, 3, 10], [3, 4, 0, 4.9]])])));
    expect([e.line, e.particle]).toEqual([3, 1]);
    expect(e.message).toMatch(/^line 3, particle 1: energy below momentum: E = 4\.9 < \|p\| = 5$/);
    const e2 = await readError(t.file('beam.jsonl', jsonl(HEADER, [fine, fine, fine, rec([[1, 2, 3, 10], [0, 0, 7, 7]])])));
    expect([e2.line, e2.particle]).toEqual([5, 1]);
    expect(e2.message).toMatch(/^line 5, particle 1: no finite rapidity: E = 7 <= \|pz\| = 7/);
    const e3 = await readError(t.file('negE.jsonl', jsonl(HEADER, [rec([[0, 0, 0, -1]])])));
    expect(e3.message).toBe('line 2, particle 0: negative energy E = -1');
    // within the 1e-6 relative tolerance E < |p| is rounding, and accepted
    const ok = await readAll(t.file('tol.jsonl', jsonl(HEADER, [rec([[3, 4, 0, 5 * (1 - 1e-9)]])])));
    expect(ok.records.length).toBe(1);
  });

  it('a truncated gzip stream', async () => {
    const recs = [];
    for (let i = 0; i < 3000; i++) recs.push({ id: i, particles: [massless(10 + i, 0.5, 1), massless(3, 0.1, 2)] });
    const full = gz(jsonl(HEADER, recs));
    const e = await readError(t.file('trunc.jsonl.gz', full.subarray(0, Math.floor(full.length * 0.6))));
    expect(e.code).toBe('gzip');
    const m = /the last complete line is line (\d+)$/.exec(e.message);
    expect(m).not.toBeNull();
    const last = Number(m![1]);
    expect(last).toBeGreaterThan(100);
    expect(e.line).toBe(last + 1);
    expect(e.message).toBe(`line ${last + 1}: the file ends inside the gzip stream (truncated file); the last complete line is line ${last}`);
    // the decompressed data really stops inside line last + 1
    const { gunzipSync } = await import('node:zlib');
    const partial = gunzipSync(full.subarray(0, Math.floor(full.length * 0.6)), { finishFlush: 2 /* Z_SYNC_FLUSH */ }).toString();
    expect(partial.split('\n').length - 1).toBe(last);
    // cut inside the first line
    const e2 = await readError(t.file('trunc1.jsonl.gz', full.subarray(0, 20)));
    expect(e2.message).toBe('line 1: the file ends inside the gzip stream (truncated file); not even line 1 is complete');
  });

  it('an empty file', async () => {
    for (const [name, content] of [['empty.jsonl', ''], ['empty.jsonl.gz', gz('')], ['blank.jsonl', '\n  \n']] as const) {
      const e = await readError(t.file(name, content));
      expect(e.code).toBe('empty');
      expect(e.message).toMatch(name === 'blank.jsonl' ? /^line 2: the file has only blank lines/ : /^line 1: the file is empty/);
    }
    const e2 = await readError(t.file('hdronly.jsonl', jsonl(HEADER, [])));
    expect(e2.message).toBe('line 1: the file has a header (line 1) but no records');
  });

  it('a record with no particles', async () => {
    const e = await readError(t.file('nopart.jsonl', jsonl(HEADER, [fine, fine, { id: 'z', particles: [] }])));
    expect(e.message).toBe('line 4: the record has no particles ("particles" is empty)');
    const e2 = await readError(t.file('nofield.jsonl', jsonl(HEADER, [{ id: 'z' }])));
    expect(e2.message).toBe('line 2: the record has no "particles" field');
  });

  it('other record fields: id, weight, pid, charge', async () => {
    expect((await readError(t.file('w.jsonl', jsonl(HEADER, [{ weight: 'x', particles: [[1, 2, 3, 10]] }])))).message).toBe(
      'line 2: "weight" must be a finite number, found "x"',
    );
    expect((await readError(t.file('id.jsonl', jsonl(HEADER, [{ id: [1], particles: [[1, 2, 3, 10]] }])))).message).toMatch(/^line 2: "id" must be a string or a number/);
    expect((await readError(t.file('pid.jsonl', jsonl(HEADER, [{ pid: [1, 2], particles: [[1, 2, 3, 10]] }])))).message).toMatch(/^line 2: "pid" must be an array of 1 integers/);
    expect((await readError(t.file('arr.jsonl', jsonl(HEADER, [[[1, 2, 3, 10]]])))).message).toMatch(/^line 2: a record must be a JSON object/);
  });

  it('one-document form: errors name the record; size limit; syntax errors name the line', async () => {
    const doc = { ...HEADER, records: [{ particles: [[1, 2, 3, 10]] }, { particles: [[1, 2, 3, 10], [0, 0, 5, 5]] }] };
    const e = await readError(t.file('doc-bad.json', JSON.stringify(doc, null, 2)));
    expect([e.where, e.line, e.particle]).toEqual(['record', 2, 1]);
    expect(e.message).toMatch(/^record 2, particle 1: no finite rapidity/);
    const big = JSON.stringify({ ...HEADER, records: Array.from({ length: 200 }, () => ({ particles: [[1, 2, 3, 10]] })) }, null, 1);
    const e2 = await readError(t.file('doc-big.json', big), { maxDocumentLength: 2000 });
    expect(e2.code).toBe('size');
    expect(e2.message).toMatch(/one-document form .* is accepted only up to 2 kB; write larger samples as JSON Lines/);
    const e2b = await readError(t.file('doc-big-1line.json', JSON.stringify(JSON.parse(big))), { maxDocumentLength: 2000 });
    expect(e2b.message).toMatch(/^line 1: the line is longer than 2 kB: the one-document form .* is accepted only up to 2 kB; /);
    const broken = JSON.stringify(doc, null, 2).replace('"particles": [\n        [\n          1,', '"particles": [\n        [\n          1,,');
    const e3 = await readError(t.file('doc-syntax.json', broken));
    expect(e3.message).toMatch(/^line 18: not valid JSON \(read as one JSON document\), column 13: /);
    expect(broken.split("\n")[17]).toContain("1,,");
    const e4 = await readError(t.file('doc-v2.json', JSON.stringify({ ...doc, version: 3 })));
    expect(e4.message).toMatch(/^line 1: unknown format version: version 3/);
  });

  it('--skip-bad skips bad records and counts them; file-level errors still stop', async () => {
    const recs = [fine, rec([]), rec([[0, 0, 1, 1]]), '{"particles":[[1,2,3,NaN]]}', fine];
    const seen: string[] = [];
    const r = await readAll(t.file('skip.jsonl', jsonl(HEADER, recs)), { skipBad: true, onSkip: (e) => seen.push(e.message) });
    expect(r.records.map((x) => x.line)).toEqual([2, 6]);
    expect(r.skipped).toBe(3);
    expect(seen.map((s) => s.split(':')[0])).toEqual(['line 3', 'line 4, particle 0', 'line 5, particle 0']);
    const e = await readError(t.file('skip-v.jsonl', jsonl({ ...HEADER, version: 9 }, recs)), { skipBad: true });
    expect(e.code).toBe('version');
    const e2 = await readError(t.file('skip-all.jsonl', jsonl(HEADER, [rec([])])), { skipBad: true });
    expect(e2.message).toMatch(/^no valid record: all 1 records were bad/);
  });
});
