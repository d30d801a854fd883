// Joins column sets of consecutive parts of one input (the scaled mode's shards) into the column set that one run
// over the whole input writes: every column concatenated in part order, with the row references (a jet's record,
// a splitting's jet, the record id offsets) moved by the rows of the parts before. The result is byte for byte
// the single run's, so a sharded sample is the same sample.
import { randomUUID } from 'node:crypto';
import { type FileHandle, mkdir, open, rename, rm, writeFile } from 'node:fs/promises';
import path from 'node:path';
import {
  type ColumnManifest,
  ColumnReader,
  type ColumnRows,
  columnFile,
  columnManifest,
  JET_COLUMNS,
  MANIFEST_FILE,
  manifestText,
  RECORD_IDS_FILE,
  RECORD_OFFSETS_FILE,
  SPLITTING_COLUMNS,
} from './columns';

/** Values copied at once. */
const CHUNK_VALUES = 1 << 20;

/** How a file's int32 values move in part k (null: copied unchanged). */
type Shift = (before: ColumnRows) => number;

interface MergedFile {
  name: string;
  width: number;
  shift: Shift | null;
  /** Leading values of every part after the first to drop (the record offsets' leading 0). */
  dropFirst: number;
}

function mergedFiles(): MergedFile[] {
  const files: MergedFile[] = [];
  for (const [name, type] of Object.entries(JET_COLUMNS)) {
    files.push({ name: columnFile('jets', name, type), width: type === 'int32' ? 4 : 8, shift: name === 'record' ? (b) => b.records : null, dropFirst: 0 });
  }
  for (const [name, type] of Object.entries(SPLITTING_COLUMNS)) {
    files.push({ name: columnFile('splittings', name, type), width: type === 'int32' ? 4 : 8, shift: name === 'jetRow' ? (b) => b.jets : null, dropFirst: 0 });
  }
  files.push({ name: RECORD_OFFSETS_FILE, width: 4, shift: (b) => b.recordBytes, dropFirst: 1 });
  files.push({ name: RECORD_IDS_FILE, width: 1, shift: null, dropFirst: 0 });
  return files;
}

async function append(out: FileHandle, from: string, file: MergedFile, first: boolean, shiftBy: number): Promise<void> {
  const input = await open(from, 'r');
  try {
    const buffer = Buffer.alloc(CHUNK_VALUES * file.width);
    let position = first ? 0 : file.dropFirst * file.width;
    for (;;) {
      const { bytesRead } = await input.read(buffer, 0, buffer.length, position);
      if (bytesRead === 0) break;
      position += bytesRead;
      if (file.shift && shiftBy !== 0) {
        const values = new Int32Array(buffer.buffer, buffer.byteOffset, bytesRead / 4);
        for (let k = 0; k < values.length; k++) values[k] += shiftBy;
      }
      let written = 0;
      while (written < bytesRead) written += (await out.write(buffer, written, bytesRead - written)).bytesWritten;
    }
  } finally {
    await input.close();
  }
}

function checkFits(rows: ColumnRows): void {
  if (rows.recordBytes > 0x7fffffff || rows.jets > 0x7fffffff || rows.records > 0x7fffffff) {
    throw new RangeError('the merged sample exceeds the 2^31 rows (or record id bytes) an int32 column can index');
  }
}

/** Writes the column set of `parts` (committed column folders, in input order) to the new folder `target`. */
export async function mergeColumnFolders(parts: string[], target: string): Promise<ColumnManifest> {
  if (parts.length === 0) throw new RangeError('nothing to merge');
  const readers = await Promise.all(parts.map((part) => ColumnReader.open(part)));
  const tree = readers[0].manifest.tree;
  const odd = readers.findIndex((reader) => reader.manifest.tree !== tree);
  if (odd >= 0) throw new Error(`part ${odd + 1} stores the ${readers[odd].manifest.tree} tree, part 1 the ${tree} tree`);
  const starts: ColumnRows[] = [];
  const total: ColumnRows = { records: 0, recordBytes: 0, jets: 0, splittings: 0 };
  for (const { manifest } of readers) {
    starts.push({ ...total });
    total.records += manifest.records.rows;
    total.recordBytes += manifest.records.bytes;
    total.jets += manifest.jets.rows;
    total.splittings += manifest.splittings.rows;
  }
  checkFits(total);
  const staging = path.join(path.dirname(target), `.${path.basename(target)}.partial-${randomUUID()}`);
  await mkdir(staging, { recursive: true });
  try {
    for (const file of mergedFiles()) {
      const out = await open(path.join(staging, file.name), 'wx');
      try {
        for (let k = 0; k < parts.length; k++) {
          await append(out, path.join(parts[k], file.name), file, k === 0, file.shift ? file.shift(starts[k]) : 0);
        }
        await out.sync();
      } finally {
        await out.close();
      }
    }
    const manifest = columnManifest(tree, total);
    await writeFile(path.join(staging, MANIFEST_FILE), manifestText(manifest));
    await rename(staging, target);
    return manifest;
  } catch (error) {
    await rm(staging, { recursive: true, force: true });
    throw error;
  }
}
