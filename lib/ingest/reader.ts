// Opens an input file (or stream) of particles and returns the reader for its format:
// splitfield-particles (JSON Lines or one document) or HepMC3 ASCII, each plain or gzip-compressed, and by path
// the columnar files (Apache Parquet, Arrow IPC) of lib/ingest/columnar/.

import { open } from 'node:fs/promises';
import type { Readable } from 'node:stream';
import { isArrowStart, openArrowFile } from './columnar/arrow-reader';
import { isParquetStart, openParquetFile } from './columnar/parquet-reader';
import { IngestError } from './errors';
import { openHepMC3FromLines } from './hepmc3-reader';
import { isGzipStart, LineSource, openLineSource, type LineSourceOptions, type SequentialFile } from './lines';
import { openParticlesFromLines } from './particles-reader';
import type { ParticleReader, ReaderOptions } from './types';

export type { ParticleReader, ParticleRecord, ReaderOptions } from './types';

/** Opens the reader of a line source's format (its first lines: the header). */
export async function openFromSource(src: LineSource, opts: ReaderOptions): Promise<ParticleReader> {
  try {
    let first: string | null;
    do {
      first = await src.readLine();
    } while (first !== null && first.trim() === '');
    if (first === null) {
      const empty = src.lineNo === 0;
      const what = empty ? 'the file is empty' : 'the file has only blank lines';
      throw new IngestError(`${what}: a splitfield-particles file starts with its header line {"format":"splitfield-particles","version":1,...}`, {
        line: empty ? 1 : src.lineNo,
        code: 'empty',
      });
    }
    if (first.startsWith('HepMC::')) return await openHepMC3FromLines(src, first, opts);
    return await openParticlesFromLines(src, first, opts);
  } catch (e) {
    src.close();
    throw e;
  }
}

/** The first bytes of a file (fewer for a shorter file; none for a file that cannot be opened, whose error the line source reports). */
async function firstBytes(path: string, n: number): Promise<Uint8Array> {
  const handle = await open(path, 'r').catch(() => null);
  if (!handle) return new Uint8Array(0);
  try {
    const b = new Uint8Array(n);
    const { bytesRead } = await handle.read(b, 0, n, 0);
    return b.subarray(0, bytesRead);
  } finally {
    await handle.close();
  }
}

/**
 * Whether a file that starts with these bytes (at least 8 of them, or the whole file) can be read as a stream while
 * it is still being written: plain text can; gzip (read again by path to name a damaged line) and the columnar
 * files (read from their end) are read once complete.
 */
export function readableWhileWritten(start: Uint8Array): boolean {
  return !isGzipStart(start) && !isParquetStart(start) && !isArrowStart(start);
}

/** Opens a file by path: format and compression are detected from the content (columnar files: columnar/). */
export async function openParticleFile(path: string, opts: ReaderOptions = {}): Promise<ParticleReader> {
  const start = await firstBytes(path, 8);
  if (isParquetStart(start)) return openParquetFile(path, opts);
  if (isArrowStart(start)) return openArrowFile(path, opts);
  const src = await openLineSource(path, { maxLineLength: opts.maxDocumentLength, maxTextBytes: opts.maxTextBytes });
  return openFromSource(src, opts);
}

/**
 * Opens a byte stream (e.g. an upload), or a file read in order (e.g. one still being written: growing-file.ts):
 * format and compression are detected from the content.
 */
export async function openParticleStream(
  stream: Readable | SequentialFile,
  opts: ReaderOptions & Pick<LineSourceOptions, 'bytesTotal' | 'name'> = {},
): Promise<ParticleReader> {
  const src = new LineSource(stream, { bytesTotal: opts.bytesTotal, name: opts.name, maxLineLength: opts.maxDocumentLength, maxTextBytes: opts.maxTextBytes });
  return openFromSource(src, opts);
}
