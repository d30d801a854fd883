// Fast line source over a byte stream: plain or gzip (detected by the magic bytes 1f 8b), any size,
// bounded memory. Lines are handed out in arrays per decoded chunk so that the hot loop stays synchronous.
// Line numbers are 1-based and count every line of the (decompressed) text, blank ones included.

import { createReadStream, promises as fsp } from 'node:fs';
import { Readable, pipeline } from 'node:stream';
import zlib from 'node:zlib';
import { IngestError } from './errors';
import { gzipExtent } from './gzip-extent';

/** Longest single line accepted (and the size limit of the one-document form). */
export const DEFAULT_MAX_LINE_BYTES = 256 * 1024 * 1024;

export interface LineSourceOptions {
  /** Size of the raw input in bytes when known (progress). */
  bytesTotal?: number | null;
  /** Longest line accepted, in characters (default 256 MiB). */
  maxLineLength?: number;
  /** Name used in messages (file name). */
  name?: string;
  /** Most bytes of text (after decompression) read before the input is refused as too large. */
  maxTextBytes?: number;
  /** The file read, when it is one: a damaged gzip stream is looked at again to name the right line. */
  file?: string;
}

/** 268435456 → "256 MB", 2000 → "2 kB". */
export function sizeText(bytes: number): string {
  return bytes >= 1048576 ? `${Math.round(bytes / 1048576)} MB` : `${Math.max(1, Math.round(bytes / 1024))} kB`;
}

function describeZlibError(e: NodeJS.ErrnoException): 'truncated' | 'corrupt' | null {
  const code = String(e.code ?? '');
  if (code === 'Z_BUF_ERROR' || /unexpected end of file/i.test(e.message)) return 'truncated';
  if (code.startsWith('Z_') || code.startsWith('ERR_ZLIB') || typeof e.errno === 'number' && /zlib|header check|invalid (block|distance|code|stored)|incorrect/i.test(e.message)) return 'corrupt';
  return null;
}

export class LineSource {
  /** Number of the last line taken (0 before the first). */
  lineNo = 0;
  /** Raw bytes read from the input (compressed bytes for gzip input). */
  bytesRead = 0;
  readonly bytesTotal: number | null;
  gzip = false;
  readonly name: string;
  private readonly file: string | null;

  /** String mode: the lines of the current region, decoded, and the next one to hand out. */
  private buf: string[] = [];
  private pos = 0;
  /** Byte mode: the current region (complete lines) and the position of its next line. */
  private region: Buffer | null = null;
  private rpos = 0;
  /** Byte mode: the last line taken is lineBytes[lineStart, lineEnd) (its CR LF or LF removed). */
  lineBytes: Buffer = Buffer.alloc(0);
  lineStart = 0;
  lineEnd = 0;
  /** Bytes of a line not yet complete (after the last LF read). */
  private restParts: Buffer[] = [];
  private restLen = 0;
  private ended = false;
  private started = false;
  private iter: AsyncIterator<Buffer> | null = null;
  private readonly maxLine: number;
  private readonly maxText: number;
  /** Bytes of text (decompressed) read so far. */
  private textBytes = 0;
  private sawAnyByte = false;
  private bomChecked = false;

  constructor(private readonly input: Readable, opts: LineSourceOptions = {}) {
    this.bytesTotal = opts.bytesTotal ?? null;
    this.maxLine = opts.maxLineLength ?? DEFAULT_MAX_LINE_BYTES;
    this.maxText = opts.maxTextBytes ?? Infinity;
    this.name = opts.name ?? 'input';
    this.file = opts.file ?? null;
  }

  /** True when the input had no bytes at all (known once the end is reached). */
  get empty(): boolean {
    return this.ended && !this.sawAnyByte;
  }

  /** Takes the next buffered line (sync), or undefined when the buffer is empty: then call fill(). */
  take(): string | undefined {
    if (this.pos < this.buf.length) {
      this.lineNo++;
      return this.buf[this.pos++];
    }
    return undefined;
  }

  /** Numbers the lines from here on as if the text so far had `line` − 1 lines (a shard's part of a longer file). */
  continueAtLine(line: number): void {
    this.lineNo = line - 1;
  }

  /** Puts the last taken line back. */
  untake(): void {
    this.pos--;
    this.lineNo--;
  }

  /** Next line, waiting for input as needed; null at the end. */
  async readLine(): Promise<string | null> {
    for (;;) {
      const l = this.take();
      if (l !== undefined) return l;
      if (!(await this.fill())) return null;
    }
  }

  /** Loads more lines. Returns false at the end of the input. */
  async fill(): Promise<boolean> {
    if (this.pos < this.buf.length) return true;
    this.buf = [];
    this.pos = 0;
    const region = await this.nextRegion();
    if (region === null) return false;
    const d = region.toString('utf8');
    // Every line of a region ends with LF but the input's last when it has none.
    const lines = d.split('\n');
    if (region[region.length - 1] === 10) lines.pop();
    for (let i = 0; i < lines.length; i++) {
      const l = lines[i];
      if (l.charCodeAt(l.length - 1) === 13) lines[i] = l.slice(0, -1);
    }
    this.buf = lines;
    return true;
  }

  /**
   * Byte mode (after the string lines wanted, e.g. a header, were taken with take()): takes the next buffered line
   * as bytes, left in lineBytes[lineStart, lineEnd); false when the buffer is empty: then call fillBytes().
   */
  takeBytes(): boolean {
    if (this.pos < this.buf.length) {
      // Lines already decoded go back to bytes once, when the reader turns to byte mode.
      this.region = Buffer.from(this.buf.slice(this.pos).join('\n') + '\n', 'utf8');
      this.rpos = 0;
      this.buf = [];
      this.pos = 0;
    }
    const r = this.region;
    if (r === null || this.rpos >= r.length) return false;
    const at = this.rpos;
    const nl = r.indexOf(10, at);
    const end = nl < 0 ? r.length : nl;
    this.lineBytes = r;
    this.lineStart = at;
    this.lineEnd = end > at && r[end - 1] === 13 ? end - 1 : end;
    this.rpos = end + 1;
    this.lineNo++;
    return true;
  }

  /** Byte mode: loads more lines. Returns false at the end of the input. */
  async fillBytes(): Promise<boolean> {
    if (this.pos < this.buf.length || (this.region !== null && this.rpos < this.region.length)) return true;
    this.region = await this.nextRegion();
    this.rpos = 0;
    return this.region !== null;
  }

  /**
   * The next run of complete lines as bytes (ending with LF, or the input's last line without it), null at the
   * end. A line never spans two regions, so a region decodes on its own (no character is cut).
   */
  private async nextRegion(): Promise<Buffer | null> {
    while (!this.ended) {
      let chunk = await this.nextChunk();
      if (chunk === null) {
        this.ended = true;
        if (this.restLen === 0) return null;
        const last = this.restParts.length === 1 ? this.restParts[0] : Buffer.concat(this.restParts);
        this.restParts = [];
        this.restLen = 0;
        return last;
      }
      if (!this.bomChecked && this.restLen + chunk.length >= 3) {
        this.bomChecked = true;
        if (this.restLen > 0) {
          chunk = Buffer.concat([...this.restParts, chunk]);
          this.restParts = [];
          this.restLen = 0;
        }
        if (chunk[0] === 0xef && chunk[1] === 0xbb && chunk[2] === 0xbf) chunk = chunk.subarray(3);
      }
      const nl = chunk.lastIndexOf(10);
      if (nl < 0) {
        if (chunk.length) {
          this.restParts.push(chunk);
          this.restLen += chunk.length;
          if (this.restLen > this.maxLine) {
            const size = sizeText(this.maxLine);
            throw new IngestError(
              `the line is longer than ${size}: the one-document form (a single JSON object with "records") is accepted only up to ${size}; ` +
                'write larger samples as JSON Lines (the header on line 1, then one record a line)',
              { line: this.lineNo + 1, code: 'size' },
            );
          }
        }
        continue;
      }
      let region = chunk.subarray(0, nl + 1);
      if (this.restLen > 0) region = Buffer.concat([...this.restParts, region]);
      this.restParts = nl + 1 < chunk.length ? [chunk.subarray(nl + 1)] : [];
      this.restLen = chunk.length - nl - 1;
      return region;
    }
    return null;
  }

  private async start(): Promise<void> {
    this.started = true;
    const raw = this.input[Symbol.asyncIterator]() as AsyncIterator<Buffer>;
    // Peek at the first bytes (at least 2) to detect gzip.
    const head: Buffer[] = [];
    let headLen = 0;
    let rawDone = false;
    while (headLen < 2) {
      const r = await this.wrapIo(() => raw.next());
      if (r.done) {
        rawDone = true;
        break;
      }
      const b = typeof r.value === 'string' ? Buffer.from(r.value) : r.value;
      head.push(b);
      headLen += b.length;
      this.bytesRead += b.length;
    }
    const first = head.length === 1 ? head[0] : Buffer.concat(head);
    if (first.length > 0) this.sawAnyByte = true;
    const self = this;
    async function* rawRest(): AsyncGenerator<Buffer> {
      if (first.length) yield first;
      if (rawDone) return;
      for (;;) {
        const r = await raw.next();
        if (r.done) return;
        const b = typeof r.value === 'string' ? Buffer.from(r.value) : r.value;
        self.bytesRead += b.length;
        yield b;
      }
    }
    if (first.length >= 2 && first[0] === 0x1f && first[1] === 0x8b) {
      this.gzip = true;
      const gz = zlib.createGunzip({ chunkSize: 256 * 1024 });
      pipeline(Readable.from(rawRest(), { objectMode: false }), gz, () => {});
      this.iter = gz[Symbol.asyncIterator]() as AsyncIterator<Buffer>;
    } else {
      const gen = rawRest();
      this.iter = gen;
    }
  }

  private async wrapIo<T>(f: () => Promise<T>): Promise<T> {
    try {
      return await f();
    } catch (e) {
      throw this.translate(e);
    }
  }

  private translate(e: unknown): Error {
    if (e instanceof IngestError) return e;
    const err = e as NodeJS.ErrnoException;
    const kind = this.gzip ? describeZlibError(err) : null;
    const last = this.lineNo;
    if (kind === 'truncated') {
      const tail = last > 0 ? `the last complete line is line ${last}` : 'not even line 1 is complete';
      return new IngestError(`the file ends inside the gzip stream (truncated file); ${tail}`, { line: last + 1, code: 'gzip', cause: e });
    }
    if (kind === 'corrupt') {
      return new IngestError(`gzip data is corrupt (${err.message}); the last complete line is line ${last}`, {
        line: last + 1,
        code: 'gzip',
        cause: e,
      });
    }
    return new IngestError(`cannot read ${this.name}: ${err?.message ?? String(e)}`, { code: 'io', cause: e });
  }

  private async nextChunk(): Promise<Buffer | null> {
    if (!this.started) await this.start();
    try {
      const r = await this.iter!.next();
      if (r.done) return null;
      this.sawAnyByte = true;
      this.textBytes += r.value.length;
      if (this.textBytes > this.maxText) {
        const what = this.gzip ? 'once decompressed, the file holds' : 'the file holds';
        throw new IngestError(
          `${what} more than ${sizeText(this.maxText)} of text, the most this server reads; it was stopped after line ${this.lineNo}`,
          { line: this.lineNo + 1, code: 'limit' },
        );
      }
      return r.value;
    } catch (e) {
      throw await this.explainGzipEnd(this.translate(e));
    }
  }

  /**
   * A gzip error at the end of a file's compressed data usually means bytes appended after it; zlib then drops the
   * text it decoded last, so the line named would be wrong. A second look at the file names the right one.
   */
  private async explainGzipEnd(error: Error): Promise<Error> {
    if (!(error instanceof IngestError) || error.code !== 'gzip' || this.file === null) return error;
    const extent = await gzipExtent(this.file).catch(() => null);
    if (!extent || extent.junkAt === null) return error;
    return new IngestError(
      `the gzip data ends after line ${extent.lines}, and the ${extent.junkBytes} bytes after it (from byte ${extent.junkAt} ` +
        'of the file) are not gzip data: remove them, or compress the file again',
      { line: extent.lines + 1, code: 'gzip', cause: error },
    );
  }

  /** Stops reading and releases the file. */
  close(): void {
    this.ended = true;
    this.input.destroy();
  }
}

/** Opens a file as a LineSource (size known for progress). */
export async function openLineSource(path: string, opts: Omit<LineSourceOptions, 'bytesTotal' | 'name'> = {}): Promise<LineSource> {
  let size: number;
  try {
    const st = await fsp.stat(path);
    if (st.isDirectory()) throw new IngestError(`cannot read ${path}: it is a directory`, { code: 'io' });
    size = st.size;
  } catch (e) {
    if (e instanceof IngestError) throw e;
    const err = e as NodeJS.ErrnoException;
    const why = err.code === 'ENOENT' ? 'no such file' : err.message;
    throw new IngestError(`cannot read ${path}: ${why}`, { code: 'io', cause: e });
  }
  const stream = createReadStream(path, { highWaterMark: 1024 * 1024 });
  return new LineSource(stream, { ...opts, bytesTotal: size, name: path, file: path });
}
