// Reading a file while it is written (an upload as it arrives): the records are those of the finished file, the
// reading starts before the writing ends, and a failed or short writing stops the reader with a clear error.
import { appendFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { GrowingFile } from '@/lib/ingest/growing-file';
import { openParticleStream, readableWhileWritten } from '@/lib/ingest/reader';
import { gz, HEADER, jsonl, massless, readAll, tempDir } from './helpers';

const t = tempDir('sf-growing-');
afterAll(() => t.cleanup());

const pause = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

describe('a file read while it is written', () => {
  it('gives the records of the finished file, and waits at its end until it is complete', async () => {
    const records = Array.from({ length: 3000 }, (_, i) => ({
      id: `r${i}`,
      particles: Array.from({ length: 5 + (i % 40) }, (_, j) => massless(1 + j + i / 100, 0.01 * j - 1, 0.1 * (i % 60))),
    }));
    const text = Buffer.from(jsonl(HEADER, records));
    const file = path.join(t.dir, 'arriving.jsonl');
    writeFileSync(file, '');
    const growing = new GrowingFile(file);
    const reading = (async () => {
      const reader = await openParticleStream(await growing.open(), { name: file });
      const got: { id: unknown; line: number; particles: number[] }[] = [];
      for await (const batch of reader.batches(2048, 16)) for (const r of batch) got.push({ id: r.id, line: r.line, particles: Array.from(r.particles) });
      reader.close();
      return got;
    })();
    // Written in pieces cut anywhere (inside lines and numbers), with pauses longer than the reader's polling.
    for (let at = 0; at < text.length; ) {
      const piece = Math.min(text.length - at, 40_000 + ((at * 7) % 9_999));
      appendFileSync(file, text.subarray(at, at + piece));
      at += piece;
      await pause(8);
    }
    const partial = await Promise.race([reading.then(() => -1), pause(30).then(() => 0)]);
    expect(partial).toBe(0); // not finished: it waits for the size
    growing.complete(text.length);
    const got = await reading;
    const whole = await readAll(t.file('whole.jsonl', text));
    expect(got.length).toBe(3000);
    expect(got).toEqual(whole.records.map((r) => ({ id: r.id, line: r.line, particles: Array.from(r.particles) })));
  });

  it('waits for the first bytes, and says which files can be read as they arrive', async () => {
    const file = path.join(t.dir, 'late.jsonl');
    const growing = new GrowingFile(file); // not even created yet
    const head = growing.head(8);
    await pause(20);
    writeFileSync(file, '{"fo');
    await pause(20);
    appendFileSync(file, 'rmat":1}');
    expect(Buffer.from(await head).toString()).toBe('{"format');
    expect(readableWhileWritten(Buffer.from('{"format'))).toBe(true);
    expect(readableWhileWritten(Buffer.from('HepMC::V'))).toBe(true);
    expect(readableWhileWritten(gz('{"format":1}').subarray(0, 8))).toBe(false);
    expect(readableWhileWritten(Buffer.from('PAR1\0\0\0\0'))).toBe(false);
    expect(readableWhileWritten(Buffer.from('ARROW1\0\0'))).toBe(false);
    // A whole file shorter than 8 bytes: its bytes once complete.
    const short = path.join(t.dir, 'short.jsonl');
    writeFileSync(short, '{}');
    const small = new GrowingFile(short);
    setTimeout(() => small.complete(2), 20);
    expect(Buffer.from(await small.head(8)).toString()).toBe('{}');
  });

  it('stops a waiting reader when the writing fails, and names a file shorter than announced', async () => {
    const content = jsonl(HEADER, [{ particles: [[1, 2, 3, 10]] }]);
    const file = t.file('broken.jsonl', content);
    const failing = new GrowingFile(file);
    const reader = await openParticleStream(await failing.open(), { name: file });
    const all = (async () => {
      for await (const batch of reader.batches()) void batch;
    })();
    setTimeout(() => failing.fail(new Error('the upload stopped')), 20);
    await expect(all).rejects.toThrow(/the upload stopped/);

    const short = new GrowingFile(file);
    short.complete(10_000);
    const shortFile = await short.open();
    const into = Buffer.alloc(1 << 16);
    expect((await shortFile.read(into, 0, into.length, null)).bytesRead).toBe(Buffer.byteLength(content));
    await expect(shortFile.read(into, 0, into.length, null)).rejects.toThrow(
      `${file} ended after ${Buffer.byteLength(content)} bytes, but 10000 were written`,
    );
    await shortFile.close();
  });
});
