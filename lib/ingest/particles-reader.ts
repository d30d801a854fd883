// Streaming reader of splitfield-particles files (DESIGN.md): JSON Lines (plain or gzip) with a header line,
// or the same content as one JSON document {header fields..., "records":[...]} up to a size limit.

import { IngestError } from './errors';
import { validateParticlesHeader, type IngestHeader } from './header';
import { jsonErrorOffset, lineAndColumn } from './json-locate';
import { DEFAULT_MAX_LINE_BYTES, sizeText, type LineSource } from './lines';
import { parseRecordLine, parseRecordObject } from './record';
import type { RecordContext } from './types';
import { BaseReader } from './reader-base';
import type { ParticleReader, ParticleRecord, RawLineBatch, RawLineSource, ReaderOptions } from './types';

function isBlank(s: string): boolean {
  if (s.length === 0) return true;
  const c = s.charCodeAt(0);
  if (c > 32) return false;
  return s.trim().length === 0;
}

/** isBlank for the line bytes[start, end) (UTF-8). */
function isBlankBytes(bytes: Uint8Array, start: number, end: number): boolean {
  for (let i = start; i < end; i++) {
    const c = bytes[i];
    if (c >= 128) return isBlank(Buffer.from(bytes.buffer, bytes.byteOffset + start, end - start).toString('utf8'));
    if (c !== 32 && c !== 9 && c !== 13 && c !== 11 && c !== 12) return false;
  }
  return true;
}

function jsonErrorPosition(msg: string): number | null {
  const m = /at position (\d+)/.exec(msg);
  return m ? Number(m[1]) : null;
}

class JsonLinesReader extends BaseReader implements RawLineSource {
  readonly kind = 'jsonl' as const;
  readonly context: RecordContext;
  constructor(header: IngestHeader, src: LineSource, opts: ReaderOptions, private readonly headerLine: number) {
    super(header, src, opts);
    this.context = { momentum: header.momentum, energyUnit: header.energyUnit, where: 'line' };
  }

  get raw(): RawLineSource {
    return this;
  }
  get skipBad(): boolean {
    return !!this.opts.skipBad;
  }

  async *rawBatches(maxChars = 1 << 20, maxRecords = 2048): AsyncGenerator<RawLineBatch> {
    const src = this.src;
    // Each batch gets its own byte buffer (it may be handed to a worker thread), a spare one given back by
    // reuse() when there is one.
    this.batchBytes = maxChars;
    const fresh = (): Uint8Array => {
      const spare = this.spares.pop();
      return spare ? new Uint8Array(spare) : new Uint8Array(maxChars);
    };
    let bytes = fresh();
    const starts = new Int32Array(maxRecords), ends = new Int32Array(maxRecords);
    const nos = new Float64Array(maxRecords);
    let n = 0, used = 0;
    const flush = (): RawLineBatch => {
      const b: RawLineBatch = { kind: 'jsonl', bytes: bytes.subarray(0, used), starts: starts.slice(0, n), ends: ends.slice(0, n), lineNos: nos.slice(0, n) };
      bytes = fresh();
      n = used = 0;
      return b;
    };
    for (;;) {
      if (!src.takeBytes()) {
        if (!(await src.fillBytes())) break;
        continue;
      }
      const lb = src.lineBytes, s = src.lineStart, e = src.lineEnd;
      if (isBlankBytes(lb, s, e)) continue;
      // A line that does not fit ends the batch (so that batches keep the size of the buffers given back); only
      // a line longer than a whole batch grows the buffer.
      if (n > 0 && used + e - s > bytes.length) yield flush();
      if (used + e - s > bytes.length) {
        const grown = new Uint8Array(Math.max(2 * bytes.length, used + e - s));
        grown.set(bytes.subarray(0, used));
        bytes = grown;
      }
      lb.copy(bytes, used, s, e);
      starts[n] = used;
      used += e - s;
      ends[n] = used;
      nos[n++] = src.lineNo;
      if (used >= maxChars || n >= maxRecords) yield flush();
    }
    if (n) yield flush();
  }
  /** Byte buffers of processed batches, to be filled again (only of the usual size: a grown one is let go). */
  private spares: ArrayBufferLike[] = [];
  private batchBytes = 0;
  reuse(buffer: ArrayBufferLike): void {
    if (buffer.byteLength === this.batchBytes) this.spares.push(buffer);
  }
  accepted(n: number): void {
    this.count += n;
  }
  rejected(e: IngestError): void {
    this.skip(e);
  }
  finish(): void {
    this.requireRecords('record', `the file has a header (line ${this.headerLine}) but no records`, this.headerLine);
  }

  async *batches(maxParticles = 65536, maxRecords = 4096): AsyncGenerator<ParticleRecord[]> {
    const src = this.src;
    const ctx = this.context;
    for (;;) {
      const line = src.take();
      if (line === undefined) {
        const b = this.takeBatch();
        if (b) yield b;
        if (!(await src.fill())) break;
        continue;
      }
      if (isBlank(line)) continue;
      const full = this.add(() => parseRecordLine(line, src.lineNo, ctx), maxParticles, maxRecords);
      if (full) yield full;
    }
    this.finish();
  }
}

class DocumentReader extends BaseReader {
  constructor(header: IngestHeader, src: LineSource, opts: ReaderOptions, private recs: unknown[] | null) {
    super(header, src, opts);
  }
  async *batches(maxParticles = 65536, maxRecords = 4096): AsyncGenerator<ParticleRecord[]> {
    const recs = this.recs;
    if (!recs) throw new Error('the records of this reader were already read');
    this.recs = null;
    const ctx: RecordContext = { momentum: this.header.momentum, energyUnit: this.header.energyUnit, where: 'record' };
    for (let i = 0; i < recs.length; i++) {
      const obj = recs[i];
      recs[i] = null; // release the parsed JSON as we go
      const full = this.add(() => parseRecordObject(obj, i + 1, ctx), maxParticles, maxRecords);
      if (full) yield full;
    }
    const b = this.takeBatch();
    if (b) yield b;
    this.requireRecords('record', 'the document has no records ("records" is empty)', 1);
  }
}

/**
 * Reads the header of a splitfield-particles input whose first non-blank line has just been taken from `src`
 * (line number src.lineNo), and returns the reader of its records.
 */
export async function openParticlesFromLines(src: LineSource, firstLine: string, opts: ReaderOptions = {}): Promise<ParticleReader> {
  const headerLine = src.lineNo;
  let parsed: unknown;
  let lineError: Error | null = null;
  try {
    parsed = JSON.parse(firstLine);
  } catch (e) {
    lineError = e as Error;
  }

  if (lineError) {
    const pos = jsonErrorPosition(lineError.message);
    const incomplete = /end of JSON input/i.test(lineError.message) || (pos !== null && pos >= firstLine.trimEnd().length);
    if (!incomplete || firstLine.trim()[0] !== '{') {
      throw new IngestError(`the header is not valid JSON: ${lineError.message}`, { line: headerLine, code: 'header' });
    }
    // A multi-line (pretty-printed) one-document file: read it whole, within the size limit.
    const limit = opts.maxDocumentLength ?? DEFAULT_MAX_LINE_BYTES;
    const parts: string[] = [firstLine];
    let len = firstLine.length;
    for (;;) {
      const l = await src.readLine();
      if (l === null) break;
      parts.push(l);
      len += l.length + 1;
      if (len > limit) {
        throw new IngestError(
          `the one-document form (a single JSON object with "records") is accepted only up to ${sizeText(limit)}; ` +
            'write larger samples as JSON Lines (the header on line 1, then one record a line)',
          { line: headerLine, code: 'size' },
        );
      }
    }
    const text = parts.join('\n');
    try {
      parsed = JSON.parse(text);
    } catch (e) {
      const msg = (e as Error).message.replace(/\s+/g, ' ');
      const at = jsonErrorOffset(text);
      const { line, column } = lineAndColumn(text, at < 0 ? text.length : at, headerLine);
      throw new IngestError(`not valid JSON (read as one JSON document), column ${column}: ${msg}`, { line, code: 'json' });
    }
    return makeDocumentReader(parsed, src, opts, headerLine);
  }

  if (parsed !== null && typeof parsed === 'object' && !Array.isArray(parsed) && 'records' in (parsed as object)) {
    // One document on one line: nothing else may follow.
    for (;;) {
      const l = await src.readLine();
      if (l === null) break;
      if (!isBlank(l)) {
        throw new IngestError('unexpected content after the one-document form (a header with "records" must be the whole file)', {
          line: src.lineNo,
          code: 'json',
        });
      }
    }
    return makeDocumentReader(parsed, src, opts, headerLine);
  }

  const h = validateParticlesHeader(parsed, headerLine);
  return new JsonLinesReader({ ...h, layout: 'jsonl', gzip: src.gzip }, src, opts, headerLine);
}

function makeDocumentReader(doc: unknown, src: LineSource, opts: ReaderOptions, headerLine: number): ParticleReader {
  const h = validateParticlesHeader(doc, headerLine);
  const recs = (doc as Record<string, unknown>).records;
  if (!Array.isArray(recs)) {
    throw new IngestError('"records" must be an array of records', { line: headerLine, field: 'records', code: 'header' });
  }
  return new DocumentReader({ ...h, layout: 'document', gzip: src.gzip }, src, opts, recs);
}
