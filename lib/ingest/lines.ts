// Fast line source over a byte stream: plain or gzip (detected by the magic bytes 1f 8b), any size,
// bounded memory. Lines are handed out in arrays per decoded chunk so that the hot loop stays synchronous.
// Line numbers are 1-based and count every line of the (decompressed) text, blank ones included.
//
// The text is read into a reused buffer (the window), a plain file straight from its file handle: each read
// appends to the start of a line left over from the last one, and the complete lines before the last LF are
// handed out as one region. No buffer is made a read, which kept the main thread's garbage collector busy (each
// new megabyte counts as external memory, and V8 collects when that grows). A plain file is read one window
// ahead, into a second buffer, while the lines of the current one are processed.

import { createReadStream, promises as fsp } from 'node:fs';
import type { FileHandle } from 'node:fs/promises';
import { Readable, pipeline } from 'node:stream';
import zlib from 'node:zlib';
import { IngestError } from './errors';
import { gzipExtent } from './gzip-extent';

/**
 * A file read in order from where the last read ended (position null), as a FileHandle reads it: each read gives up
 * to `length` bytes, 0 only at the end.
 */
export interface SequentialFile {
  read(buffer: Buffer, offset: number, length: number, position: null): Promise<{ bytesRead: number }>;
  close(): Promise<void>;
}

/** Whether bytes start as gzip data does (its magic bytes 1f 8b). */
export function isGzipStart(b: Uint8Array): boolean {
  return b.length >= 2 && b[0] === 0x1f && b[1] === 0x8b;
}

/** Longest single line accepted (and the size limit of the one-document form). */
export const DEFAULT_MAX_LINE_BYTES = 256 * 1024 * 1024;

/** Size of the window the text is read into (it grows for a longer line, and shrinks back after it). */
const WINDOW_BYTES = 1 << 20;

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
  private readonly input: Readable | null;

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
  /** Text read and not yet cut into regions: window[0, winLen); the current region is window[0, regionEnd). */
  private window: Buffer = Buffer.allocUnsafe(WINDOW_BYTES);
  private winLen = 0;
  private regionEnd = 0;
  private ended = false;
  private started = false;
  /** A plain file is read through its handle; any other input (gzip, a stream) through `iter`. */
  private readonly handle: SequentialFile | null;
  private iter: AsyncIterator<Buffer> | null = null;
  /**
   * A plain file is read one window ahead: once a region is handed out, the start of a line after it is copied to
   * the front of the other window and the file is read after it while the region's lines are processed.
   */
  private ahead: { window: Buffer; rest: number; read: Promise<{ bytesRead: number }> } | null = null;
  private spare: Buffer | null = null;
  /** The part of the stream's last chunk that did not fit in the window yet: pending[pendingAt..]. */
  private pending: Uint8Array | null = null;
  private pendingAt = 0;
  private readonly maxLine: number;
  private readonly maxText: number;
  /** Bytes of text (decompressed) read so far. */
  private textBytes = 0;
  private sawAnyByte = false;
  private bomChecked = false;

  /**
   * `input`: a byte stream, or a plain (not gzip) file read from its start to its end (a file handle, or a file
   * still being written: growing-file.ts), closed at its end.
   */
  constructor(input: Readable | SequentialFile, opts: LineSourceOptions = {}) {
    this.input = input instanceof Readable ? input : null;
    this.handle = input instanceof Readable ? null : input;
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
   * end. A line never spans two regions, so a region decodes on its own (no character is cut). The region is a
   * view of the window, valid until the next call.
   */
  private async nextRegion(): Promise<Buffer | null> {
    this.keepRest();
    while (!this.ended) {
      if (this.winLen === this.window.length) this.growWindow();
      let from = this.winLen;
      if (!(await this.readMore())) {
        this.ended = true;
        break;
      }
      if (!this.bomChecked && this.winLen >= 3) {
        this.bomChecked = true;
        const w = this.window;
        if (w[0] === 0xef && w[1] === 0xbb && w[2] === 0xbf) {
          w.copyWithin(0, 3, this.winLen);
          this.winLen -= 3;
          from = 0;
        }
      }
      // Only the new bytes can hold an LF: the ones before them are the start of a line.
      const nl = this.window.subarray(from, this.winLen).lastIndexOf(10);
      if (nl < 0) {
        if (this.winLen > this.maxLine) {
          const size = sizeText(this.maxLine);
          throw new IngestError(
            `the line is longer than ${size}: the one-document form (a single JSON object with "records") is accepted only up to ${size}; ` +
              'write larger samples as JSON Lines (the header on line 1, then one record a line)',
            { line: this.lineNo + 1, code: 'size' },
          );
        }
        continue;
      }
      this.regionEnd = from + nl + 1;
      this.readAhead();
      return this.window.subarray(0, this.regionEnd);
    }
    if (this.winLen === 0) return null;
    this.regionEnd = this.winLen;
    return this.window.subarray(0, this.winLen);
  }

  /** A plain file with a usual window: starts reading the next window (see `ahead`). */
  private readAhead(): void {
    const rest = this.winLen - this.regionEnd;
    if (!this.handle || this.window.length !== WINDOW_BYTES || rest > WINDOW_BYTES / 2) return;
    const next = this.spare ?? Buffer.allocUnsafe(WINDOW_BYTES);
    this.spare = null;
    this.window.copy(next, 0, this.regionEnd, this.winLen);
    const read = this.handle.read(next, rest, next.length - rest, null);
    read.catch(() => undefined); // awaited (and reported) by readMore
    this.ahead = { window: next, rest, read };
  }

  /** Drops the region handed out last: the start of a line after it moves to the front of the window. */
  private keepRest(): void {
    if (this.regionEnd === 0) return;
    if (this.ahead) {
      // The other window already holds it, and the read after it is under way.
      this.spare = this.window;
      this.window = this.ahead.window;
      this.winLen = this.ahead.rest;
      this.regionEnd = 0;
      return;
    }
    const rest = this.winLen - this.regionEnd;
    if (this.window.length > WINDOW_BYTES && rest < WINDOW_BYTES / 2) {
      // Back to the usual size after a long line.
      const w = Buffer.allocUnsafe(WINDOW_BYTES);
      this.window.copy(w, 0, this.regionEnd, this.winLen);
      this.window = w;
    } else this.window.copyWithin(0, this.regionEnd, this.winLen);
    this.winLen = rest;
    this.regionEnd = 0;
  }

  /** A window full of one unfinished line: twice the room. */
  private growWindow(): void {
    const w = Buffer.allocUnsafe(2 * this.window.length);
    this.window.copy(w, 0, 0, this.winLen);
    this.window = w;
  }

  /** Reads more text into the window after winLen; false at the end of the input. */
  private async readMore(): Promise<boolean> {
    const room = this.window.length - this.winLen;
    let got: number;
    if (this.handle) {
      const h = this.handle;
      const ahead = this.ahead;
      this.ahead = null;
      got = (await this.wrapIo(() => ahead?.read ?? h.read(this.window, this.winLen, room, null))).bytesRead;
      if (got === 0) {
        await h.close().catch(() => undefined);
        return false;
      }
      this.bytesRead += got;
      this.countText(got);
    } else {
      if (this.pending === null || this.pendingAt === this.pending.length) {
        const chunk = await this.nextChunk();
        if (chunk === null) return false;
        this.pending = chunk;
        this.pendingAt = 0;
      }
      got = Math.min(room, this.pending.length - this.pendingAt);
      this.window.set(this.pending.subarray(this.pendingAt, this.pendingAt + got), this.winLen);
      this.pendingAt += got;
    }
    this.winLen += got;
    return true;
  }

  /** Counts text read, refusing more than maxTextBytes. */
  private countText(n: number): void {
    this.sawAnyByte = true;
    this.textBytes += n;
    if (this.textBytes > this.maxText) {
      const what = this.gzip ? 'once decompressed, the file holds' : 'the file holds';
      throw new IngestError(
        `${what} more than ${sizeText(this.maxText)} of text, the most this server reads; it was stopped after line ${this.lineNo}`,
        { line: this.lineNo + 1, code: 'limit' },
      );
    }
  }

  private async start(): Promise<void> {
    this.started = true;
    const raw = this.input![Symbol.asyncIterator]() as AsyncIterator<Buffer>;
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
    if (isGzipStart(first)) {
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

  private async nextChunk(): Promise<Uint8Array | null> {
    if (!this.started) await this.start();
    try {
      const r = await this.iter!.next();
      if (r.done) return null;
      this.countText(r.value.length);
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
    this.input?.destroy();
    this.handle?.close().catch(() => undefined);
  }
}

/** Opens a file as a LineSource (size known for progress). */
export async function openLineSource(path: string, opts: Omit<LineSourceOptions, 'bytesTotal' | 'name'> = {}): Promise<LineSource> {
  let handle: FileHandle | null = null;
  let size: number;
  let gzip: boolean;
  try {
    handle = await fsp.open(path, 'r');
    const st = await handle.stat();
    if (st.isDirectory()) throw new IngestError(`cannot read ${path}: it is a directory`, { code: 'io' });
    size = st.size;
    const head = Buffer.alloc(2);
    const { bytesRead } = await handle.read(head, 0, 2, 0);
    gzip = isGzipStart(head.subarray(0, bytesRead));
  } catch (e) {
    await handle?.close().catch(() => undefined);
    if (e instanceof IngestError) throw e;
    const err = e as NodeJS.ErrnoException;
    const why = err.code === 'ENOENT' ? 'no such file' : err.code === 'EISDIR' ? 'it is a directory' : err.message;
    throw new IngestError(`cannot read ${path}: ${why}`, { code: 'io', cause: e });
  }
  const named = { ...opts, bytesTotal: size, name: path, file: path };
  if (!gzip) return new LineSource(handle, named);
  await handle.close();
  return new LineSource(createReadStream(path, { highWaterMark: 1024 * 1024 }), named);
}
