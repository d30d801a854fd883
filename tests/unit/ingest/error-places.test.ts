// Messages of bad input name the line (or field) and what is wrong, also for inputs that used to fail without
// one: deeply nested JSON, bytes appended after gzip data, numbers beyond a double's range, a text limit.
import { afterAll, describe, expect, it } from 'vitest';
import { gzipSync } from 'node:zlib';
import { HEADER, gz, jsonl, readAll, readError, tempDir } from './helpers';

const files = tempDir();
afterAll(() => files.cleanup());

const record = (id: number) => ({ id, particles: [[10, 0, 5, 12], [0, 8, -2, 9]] });
const deep = (levels: number) => `${'['.repeat(levels)}${']'.repeat(levels)}`;

describe('deeply nested JSON', () => {
  it('in a record: names the line and the particle', async () => {
    const text = `${JSON.stringify(HEADER)}\n${JSON.stringify(record(1))}\n{"id":2,"particles":[${deep(200_000)}]}\n`;
    const error = await readError(files.file('deep-record.jsonl', text));
    expect(error.message).toMatch(/^line 3, particle 0: a particle must be an array of 4 numbers .* found an array nested too deeply to show$/);
  });

  it('in the header: names the line and the field', async () => {
    const text = `{"format":"splitfield-particles","version":1,"content":"jets","notes":${deep(100_000)}}\n${JSON.stringify(record(1))}\n`;
    const error = await readError(files.file('deep-header.jsonl', text));
    expect(error.message).toBe('line 1: wrong header: the field "notes" nests objects or arrays more than 32 levels deep');
    expect(error.field).toBe('notes');
  });

  it('in the one-document form: names the record and the field', async () => {
    const text = `{"format":"splitfield-particles","version":1,"content":"jets","records":[${JSON.stringify(record(1))},{"id":${deep(100_000)},"particles":[[1,0,0,1]]}]}`;
    const error = await readError(files.file('deep-document.json', text));
    expect(error.message).toBe('record 2: "id" must be a string or a number, found an array nested too deeply to show');
  });
});

describe('numbers and gzip', () => {
  it('names a weight beyond the range of a double as what it was read as', async () => {
    const text = `${jsonl(HEADER, [record(1)])}{"id":2,"weight":-1e400,"particles":[[10,0,5,12]]}\n`;
    const error = await readError(files.file('weight.jsonl', text));
    expect(error.message).toBe('line 3: "weight" must be a finite number, found -Infinity (a number beyond the range of a double, such as 1e400)');
    expect(error.field).toBe('weight');
  });

  it('names the last line of gzip data followed by junk, and where the junk starts', async () => {
    const records = Array.from({ length: 50 }, (_, i) => record(i + 1));
    const compressed = gz(jsonl(HEADER, records));
    const error = await readError(files.file('junk.jsonl.gz', Buffer.concat([compressed, Buffer.from('appended by a mail program\n')])));
    expect(error.code).toBe('gzip');
    expect(error.message).toBe(
      `line 52: the gzip data ends after line 51, and the 27 bytes after it (from byte ${compressed.length} of the file) are not gzip data: remove them, or compress the file again`,
    );
  });

  it('still reads gzip files of several members, and zero padding after the data', async () => {
    const first = gzipSync(jsonl(HEADER, [record(1), record(2)]));
    const second = gzipSync(`${JSON.stringify(record(3))}\n`);
    const read = await readAll(files.file('members.jsonl.gz', Buffer.concat([first, second, Buffer.alloc(16)])));
    expect(read.records.map((r) => r.id)).toEqual([1, 2, 3]);
  });

  it('stops a file whose decompressed text is over the limit, naming the line reached', async () => {
    const records = Array.from({ length: 2000 }, (_, i) => record(i + 1));
    const error = await readError(files.file('big.jsonl.gz', gz(jsonl(HEADER, records))), { maxTextBytes: 20_000 });
    expect(error.code).toBe('limit');
    expect(error.message).toMatch(/^line \d+: once decompressed, the file holds more than 20 kB of text, the most this server reads; it was stopped after line \d+$/);
  });
});
