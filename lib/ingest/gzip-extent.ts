// On the error path only: how far a gzip file's valid compressed data goes, and how many lines it decodes to.
// zlib reports bytes appended after the compressed data ("junk") as a corrupt stream and drops the text it decoded
// just before, so the line count of the streaming reader is short; this second pass reads the file member by
// member with a raw inflater, which stops at the end of each member's data and says how much of the input it used.
import { createReadStream } from 'node:fs';
import zlib from 'node:zlib';

export interface GzipExtent {
  /** Lines of text the valid gzip members decode to (a last line without a newline counts). */
  lines: number;
  /** Byte offset where bytes that are not gzip data begin; null when the file is gzip to its end. */
  junkAt: number | null;
  /** Bytes of the file from `junkAt` to its end. */
  junkBytes: number;
}

const FLAG = { HCRC: 2, EXTRA: 4, NAME: 8, COMMENT: 16 };

class ChunkReader {
  private buffer = Buffer.alloc(0);
  /** Absolute offset of buffer[0]. */
  offset = 0;
  private ended = false;
  private readonly iterator: AsyncIterator<Buffer>;

  constructor(file: string) {
    this.iterator = createReadStream(file, { highWaterMark: 1 << 20 })[Symbol.asyncIterator]();
  }

  /** At least `n` bytes buffered (fewer only at the end of the file). */
  async need(n: number): Promise<Buffer> {
    while (this.buffer.length < n && !this.ended) {
      const next = await this.iterator.next();
      if (next.done) this.ended = true;
      else this.buffer = Buffer.concat([this.buffer, next.value]);
    }
    return this.buffer;
  }

  /** The buffered bytes, or the next chunk when none is buffered; empty at the end. */
  async take(): Promise<Buffer> {
    await this.need(1);
    const taken = this.buffer;
    this.offset += taken.length;
    this.buffer = Buffer.alloc(0);
    return taken;
  }

  /** Gives back the unused tail of what was taken. */
  giveBack(tail: Buffer): void {
    this.buffer = Buffer.concat([tail, this.buffer]);
    this.offset -= tail.length;
  }

  skip(n: number): void {
    this.buffer = this.buffer.subarray(n);
    this.offset += n;
  }

  async rest(): Promise<number> {
    let size = 0;
    for (let chunk = await this.take(); chunk.length > 0; chunk = await this.take()) size += chunk.length;
    return size;
  }
}

/** Length of the gzip member header at the start of `head`, or null when it is not one (or is cut short). */
function headerLength(head: Buffer): number | null {
  if (head.length < 10 || head[0] !== 0x1f || head[1] !== 0x8b || head[2] !== 8) return null;
  const flags = head[3];
  let at = 10;
  if (flags & FLAG.EXTRA) {
    if (head.length < at + 2) return null;
    at += 2 + head.readUInt16LE(at);
  }
  for (const flag of [FLAG.NAME, FLAG.COMMENT]) {
    if (!(flags & flag)) continue;
    const end = head.indexOf(0, at);
    if (end < 0) return null;
    at = end + 1;
  }
  if (flags & FLAG.HCRC) at += 2;
  return at <= head.length ? at : null;
}

/** Inflates one member's compressed data, counting lines; true when its data ended cleanly, false when damaged or cut. */
async function inflateMember(reader: ChunkReader, count: { newlines: number; lastByte: number }): Promise<boolean> {
  const inflater = zlib.createInflateRaw();
  inflater.on('data', (text: Buffer) => {
    for (let i = text.indexOf(10); i >= 0; i = text.indexOf(10, i + 1)) count.newlines++;
    if (text.length > 0) count.lastByte = text[text.length - 1];
  });
  let fed = 0;
  try {
    for (;;) {
      const chunk = await reader.take();
      if (chunk.length === 0) return false; // the file ends inside the member
      await new Promise<void>((resolve, reject) => {
        inflater.once('error', reject);
        inflater.write(chunk, () => {
          inflater.off('error', reject);
          resolve();
        });
      });
      fed += chunk.length;
      // The inflater ignores what follows the end of the compressed data, and counts only what it used.
      const unused = fed - inflater.bytesWritten;
      if (unused > 0) {
        reader.giveBack(chunk.subarray(chunk.length - unused));
        return true;
      }
    }
  } catch {
    return false;
  } finally {
    inflater.destroy();
  }
}

export async function gzipExtent(file: string): Promise<GzipExtent> {
  const reader = new ChunkReader(file);
  const count = { newlines: 0, lastByte: 10 };
  const lines = () => count.newlines + (count.lastByte === 10 ? 0 : 1);
  for (;;) {
    const head = await reader.need(1024);
    if (head.length === 0) return { lines: lines(), junkAt: null, junkBytes: 0 };
    const length = headerLength(head);
    if (length === null) {
      // Zero bytes after the last member are padding that readers accept.
      const junkAt = reader.offset;
      const rest = await reader.rest();
      const zeros = head.every((byte) => byte === 0) && rest === head.length;
      return zeros ? { lines: lines(), junkAt: null, junkBytes: 0 } : { lines: lines(), junkAt, junkBytes: rest };
    }
    reader.skip(length);
    if (!(await inflateMember(reader, count))) return { lines: lines(), junkAt: null, junkBytes: 0 };
    await reader.need(8);
    reader.skip(8); // CRC-32 and size of the member
  }
}
