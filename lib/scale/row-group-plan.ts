// Where a Parquet upload is cut into shards: between row groups, read from the file's footer alone (one or two
// ranged reads of the object's end). A shard is consecutive row groups of about SPLITFIELD_SHARD_BYTES (compressed)
// and knows the bytes of its column chunks, so its job fetches only those and the footer. In the flat layout a
// record's rows may run on into the next row group: a cut goes only where the "record" column's statistics show the
// groups' records apart.
import { type FileMetaData, parquetMetadataAsync, type RowGroup } from 'hyparquet';
import { parquetColumns } from '@/lib/ingest/columnar/parquet-reader';
import { type ObjectStore, readObjectBytes } from '@/lib/objects/object-store';

export interface RowGroupShard {
  /** Row groups [firstGroup, endGroup) of the file. */
  firstGroup: number;
  endGroup: number;
  /** Bytes [start, end) of the file holding these row groups' column chunks. */
  start: number;
  end: number;
}

export interface RowGroupPlan {
  kind: 'rowGroups';
  /** Bytes [footerStart, file size) are the footer (metadata, its length and the closing magic). */
  footerStart: number;
  shards: RowGroupShard[];
}

/** hyparquet's file interface over an object, one ranged read a slice. */
function objectBuffer(store: ObjectStore, key: string, size: number) {
  return {
    byteLength: size,
    async slice(start: number, end = size): Promise<ArrayBuffer> {
      const bytes = await readObjectBytes(store, key, { start, end });
      return bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer;
    },
  };
}

/** The bytes of a row group's column chunks (each starts at its dictionary page, if any). */
function bytesOf(group: RowGroup): { start: number; end: number } {
  let start = Infinity;
  let end = 0;
  for (const column of group.columns) {
    const meta = column.meta_data!;
    const first = Number(meta.dictionary_page_offset || meta.data_page_offset);
    start = Math.min(start, first);
    end = Math.max(end, first + Number(meta.total_compressed_size));
  }
  return { start, end };
}

/** Whether every record of row group g − 1 is known (from statistics) to come before every record of group g. */
function recordsApart(metadata: FileMetaData, g: number): boolean {
  const stats = (group: RowGroup) => group.columns.find((column) => column.meta_data?.path_in_schema.join('.') === 'record')?.meta_data?.statistics;
  const before = stats(metadata.row_groups[g - 1])?.max_value;
  const after = stats(metadata.row_groups[g])?.min_value;
  const isInteger = (value: unknown) => typeof value === 'number' || typeof value === 'bigint';
  return isInteger(before) && isInteger(after) && (before as number | bigint) < (after as number | bigint);
}

/**
 * The row-group shards of the Parquet upload `key`, or null when it is one shard (one row group, a footer that
 * cannot be read, a file not in Splitfield's schema: the whole-file read reports those exactly as the embedded mode).
 */
export async function planRowGroups(store: ObjectStore, key: string, size: number, shardBytes: number): Promise<RowGroupPlan | null> {
  let metadata: FileMetaData;
  let flat: boolean;
  try {
    metadata = await parquetMetadataAsync(objectBuffer(store, key, size));
    flat = parquetColumns(metadata).plan.layout === 'flat';
  } catch {
    return null;
  }
  const groups = metadata.row_groups;
  const shards: RowGroupShard[] = [];
  let current: RowGroupShard | null = null;
  for (let g = 0; g < groups.length; g++) {
    const bytes = bytesOf(groups[g]);
    const cut = current !== null && current.end - current.start >= shardBytes && (!flat || recordsApart(metadata, g));
    if (current === null || cut) {
      current = { firstGroup: g, endGroup: g + 1, ...bytes };
      shards.push(current);
    } else {
      current.endGroup = g + 1;
      current.start = Math.min(current.start, bytes.start);
      current.end = Math.max(current.end, bytes.end);
    }
  }
  if (shards.length < 2) return null;
  return { kind: 'rowGroups', footerStart: size - 8 - metadata.metadata_length, shards };
}
