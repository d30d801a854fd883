// Shapes shared by the readers, the pipeline and the sinks. Reader output is format-agnostic:
// px, py, pz, E in GeV whatever the file's convention and unit.

import type { EnergyUnit, MomentumConvention } from '../physics/fourvector';
import type { IngestError, IngestWhere } from './errors';
import type { IngestHeader } from './header';

export type { IngestHeader } from './header';

export interface ParticleRecord {
  /** 1-based line of the record in the file (record index in the one-document form; the E line for HepMC3). */
  line: number;
  /** The record's id as given (string or number); defaults to the line (record) number. */
  id: string | number;
  weight: number;
  /** 4 doubles a particle: px, py, pz, E in GeV. */
  particles: Float64Array;
  /** Optional per-particle PDG ids (same length as the particles). */
  pid?: Int32Array;
  /** Optional per-particle charges. */
  charge?: Float64Array;
  /** Optional tag particles (px, py, pz, E in GeV; HepMC3: decayed heavy-flavour hadrons) and their pids. */
  tags?: Float64Array;
  tagPid?: Int32Array;
}

/** How a record's numbers are read: the header's momentum convention and unit, and how errors name the place. */
export interface RecordContext {
  momentum: MomentumConvention;
  energyUnit: EnergyUnit;
  where: IngestWhere;
}

export interface ReaderOptions {
  /** Skip records that fail validation (counted in `skipped`) instead of stopping at the first. */
  skipBad?: boolean;
  /** Called for each skipped record. */
  onSkip?: (e: IngestError) => void;
  /** Size limit of the one-document form (characters of JSON text); default 256 MiB. */
  maxDocumentLength?: number;
  /** Most bytes of text (decompressed) read before the file is refused as too large; default no limit. */
  maxTextBytes?: number;
}

export interface ParticleReader {
  readonly header: IngestHeader;
  /** Records in file order, in arrays of bounded size (one pass; do not mix with records()). */
  batches(maxParticles?: number, maxRecords?: number): AsyncGenerator<ParticleRecord[]>;
  /** Records one at a time, in file order (one pass). */
  records(): AsyncGenerator<ParticleRecord>;
  /** Raw bytes read so far (compressed bytes for gzip input). */
  readonly bytesRead: number;
  readonly bytesTotal: number | null;
  /** Records skipped as bad (only with skipBad). */
  readonly skipped: number;
  /** The first few skipped records' errors. */
  readonly skippedErrors: IngestError[];
  close(): void;
  /**
   * The unparsed records (JSON Lines records, HepMC3 event blocks), so that the pipeline can parse and validate
   * them in its worker threads. Use either this or batches()/records(), not both.
   */
  readonly raw?: RawLineSource;
}

/**
 * Consecutive records, unparsed, with their 1-based (first) line numbers: JSON Lines records as UTF-8 bytes
 * (record i is bytes[starts[i], ends[i]); the buffers can be handed to a worker thread), HepMC3 event blocks as
 * strings.
 */
export type RawLineBatch =
  | { kind: 'jsonl'; bytes: Uint8Array; starts: Int32Array; ends: Int32Array; lineNos: Float64Array }
  | { kind: 'hepmc3'; lines: string[]; lineNos: Float64Array };

export interface RawLineSource {
  /** 'jsonl': each text is one JSON Lines record; 'hepmc3': each text is one HepMC3 event block (E line first). */
  readonly kind: 'jsonl' | 'hepmc3';
  readonly context: RecordContext;
  readonly skipBad: boolean;
  rawBatches(maxChars?: number, maxRecords?: number): AsyncGenerator<RawLineBatch>;
  /**
   * Takes back the byte buffer of a processed JSON Lines batch (its bytes' buffer), to fill it again instead of
   * making a new one: a new megabyte a batch kept the garbage collector of the reading thread busy.
   */
  reuse?(buffer: ArrayBufferLike): void;
  /** Counts records parsed elsewhere (in file order). */
  accepted(n: number): void;
  /** A record parsed elsewhere was bad: counts it when skipping, else throws it. */
  rejected(e: IngestError): void;
  /** After the last batch: throws when the file had no valid record. */
  finish(): void;
}

export const MAX_KEPT_SKIP_ERRORS = 20;

/** How jet lines are written: e+e- jets carry E and theta for pt and y; tagged jets carry their flavour. */
export interface JetLineStyle {
  /** The lines carry "all", every splitting of the C/A tree. */
  fullTree: boolean;
  ee: boolean;
  flavour: boolean;
}
