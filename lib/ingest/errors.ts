// The one error class of the ingest layer. Its message always says where the problem is:
//   "line 50000, particle 3: energy below momentum: E = 1 < |p| = 2"
// Line numbers are 1-based lines of the file (JSON Lines, HepMC3); in the one-document form of
// splitfield-particles the position is "record N" (1-based index in "records"). Particle indices are
// 0-based positions in the record's "particles" array (particles[3] is "particle 3"); for HepMC3 the
// particle is named by its HepMC id.

export type IngestWhere = 'line' | 'record' | 'row';

export interface IngestErrorDetail {
  /** 1-based line number (or record number in the one-document form); null when the whole file is concerned. */
  line?: number | null;
  /** 0-based particle index within the record (or the HepMC particle id). */
  particle?: number;
  /** The record field or momentum component concerned, e.g. "pz", "weight", "header.version". */
  field?: string;
  where?: IngestWhere;
  /** Columnar files: the row group (Parquet) or record batch (Arrow), 0-based; with where 'row', line is the row. */
  rowGroup?: number;
  /** Columnar files: the column concerned. */
  column?: string;
  /** How the particle is named in the message (default "particle"). */
  particleLabel?: string;
  /** True when only this record is bad and the rest of the file can still be read (--skip-bad). */
  recordLevel?: boolean;
  /** Error code for programs: 'header', 'version', 'json', 'record', 'particle', 'gzip', 'empty', 'size', 'io', 'hepmc'. */
  code?: string;
  cause?: unknown;
}

export class IngestError extends Error {
  readonly line: number | null;
  readonly particle?: number;
  readonly field?: string;
  readonly where: IngestWhere;
  readonly recordLevel: boolean;
  readonly code: string;
  readonly particleLabel?: string;
  readonly rowGroup?: number;
  readonly column?: string;
  /** The message without the position prefix. */
  readonly detail: string;

  constructor(detail: string, info: IngestErrorDetail = {}) {
    const where = info.where ?? 'line';
    const parts: string[] = [];
    if (info.rowGroup != null) parts.push(`row group ${info.rowGroup}`);
    if (info.line != null) parts.push(`${where} ${info.line}`);
    if (info.column != null) parts.push(`column ${info.column}`);
    if (info.particle != null) parts.push(`${info.particleLabel ?? 'particle'} ${info.particle}`);
    super(parts.length ? `${parts.join(', ')}: ${detail}` : detail, info.cause !== undefined ? { cause: info.cause } : undefined);
    this.name = 'IngestError';
    this.detail = detail;
    this.line = info.line ?? null;
    this.particle = info.particle;
    this.field = info.field;
    this.where = where;
    this.recordLevel = info.recordLevel ?? false;
    this.code = info.code ?? 'record';
    this.particleLabel = info.particleLabel;
    this.rowGroup = info.rowGroup;
    this.column = info.column;
  }

  /** A plain object that crosses a worker-thread boundary (structured clone drops the class). */
  toPlain(): PlainIngestError {
    return {
      detail: this.detail,
      line: this.line,
      particle: this.particle,
      field: this.field,
      where: this.where,
      recordLevel: this.recordLevel,
      code: this.code,
      particleLabel: this.particleLabel,
      rowGroup: this.rowGroup,
      column: this.column,
    };
  }

  static fromPlain(p: PlainIngestError): IngestError {
    return new IngestError(p.detail, p);
  }
}

export interface PlainIngestError extends IngestErrorDetail {
  detail: string;
}

/** Thrown by the pipeline when its AbortSignal fires. */
export class IngestAbortError extends Error {
  constructor(message = 'processing was cancelled') {
    super(message);
    this.name = 'AbortError';
  }
}
