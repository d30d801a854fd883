// Writer of the splitfield-declusterings export (DESIGN.md "Export format"), JSON Lines:
// a header line, then one line a selected jet (export-lines.ts). Numbers are written at full double precision
// (String(x) is the shortest round-trip form, as JSON.stringify); undefined values are null.

import { once } from 'node:events';
import type { Writable } from 'node:stream';
import pkg from '../../package.json';
import type { ProcessSettings, RecordResult } from '../physics/types';
import { encodeJets } from './export-lines';
import type { IngestHeader } from './header';
import type { BatchCounts, PipelineSummary, RecordMeta, ResultSink, WorkerFormat } from './pipeline/sink';

export const DECLUSTERINGS_FORMAT = 'splitfield-declusterings';
export const DECLUSTERINGS_VERSION = 1;
export const SOFTWARE_VERSION: string = (pkg as { version: string }).version;

/** Column order of a "primary" entry. */
export const PRIMARY_COLUMNS = ['lnInvDelta', 'lnKt', 'z', 'delta', 'kt', 'psi', 'm'] as const;
/** Column order of an "all" entry. */
export const ALL_COLUMNS = ['generation', 'lnInvDelta', 'lnKt', 'z'] as const;

/** The export's header object. */
export function exportHeader(input: IngestHeader, s: ProcessSettings, inputName?: string): Record<string, unknown> {
  return {
    format: DECLUSTERINGS_FORMAT,
    version: DECLUSTERINGS_VERSION,
    content: s.content,
    jetDefinition: { algorithm: s.jet.algorithm, R: s.jet.R, recombination: 'E' },
    cuts: { ptMin: s.jet.ptMin, yMax: s.jet.yMax, maxJets: s.jet.maxJets },
    reclustering: 'ca',
    softDrop: { zCut: s.softDrop.zCut, beta: s.softDrop.beta, R0: s.softDrop.R0 },
    multiplicityKtCut: s.multiplicityKtCut,
    fullTree: s.fullTree,
    columns: { primary: [...PRIMARY_COLUMNS], all: s.fullTree ? [...ALL_COLUMNS] : undefined, sd: ['mg', 'zg', 'Rg'] },
    software: { name: 'splitfield', version: SOFTWARE_VERSION },
    input: {
      ...(inputName ? { file: inputName } : {}),
      format: input.format,
      version: input.version,
      sample: input.sample,
    },
  };
}

/**
 * The export lines (with trailing newlines) of consecutive records, as text (encodeJets' bytes: the same text as
 * JSON.stringify of each jet's object).
 */
export function formatJets(records: RecordMeta[], results: RecordResult[], fullTree: boolean): string {
  return textDecoder.decode(encodeJets(records, results, fullTree));
}

const textDecoder = new TextDecoder();

/** The bytes a sink's WorkerFormat asks for (made in the thread that processed the batch). */
export function formatForSink(f: WorkerFormat, records: RecordMeta[], results: RecordResult[]): Uint8Array {
  return encodeJets(records, results, f.fullTree);
}

/**
 * Sink that writes the export to a stream, respecting backpressure. It does not end the stream. The export text
 * is made where each batch is processed (workerFormat), so that it scales with the threads.
 */
export class ExportWriter implements ResultSink {
  private fullTree = false;
  workerFormat: WorkerFormat | null = null;
  jetsWritten = 0;
  bytesWritten = 0;
  constructor(
    private readonly out: Writable,
    private readonly opts: { inputName?: string } = {},
  ) {}

  private async put(s: string | Uint8Array): Promise<void> {
    if (!s.length) return;
    this.bytesWritten += typeof s === 'string' ? Buffer.byteLength(s) : s.length;
    if (!this.out.write(s)) {
      if (this.out.destroyed) throw new Error('the output stream was closed');
      await once(this.out, 'drain');
    }
  }

  async begin(header: IngestHeader, settings: ProcessSettings): Promise<void> {
    this.fullTree = settings.fullTree;
    this.workerFormat = { kind: 'export', fullTree: settings.fullTree };
    await this.put(JSON.stringify(exportHeader(header, settings, this.opts.inputName)) + '\n');
  }

  async write(records: RecordMeta[], results: RecordResult[]): Promise<void> {
    for (const r of results) this.jetsWritten += r.jets.length;
    await this.put(encodeJets(records, results, this.fullTree));
  }

  async writeFormatted(bytes: Uint8Array, counts: BatchCounts): Promise<void> {
    this.jetsWritten += counts.jets;
    await this.put(bytes);
  }

  async end(_summary: PipelineSummary): Promise<void> {}
}
