// Writer of the splitfield-declusterings export (DESIGN.md "Export format"), JSON Lines:
// a header line, then one line a selected jet (export-lines.ts). Numbers are written at full double precision
// (String(x) is the shortest round-trip form, as JSON.stringify); undefined values are null.

import { once } from 'node:events';
import type { Writable } from 'node:stream';
import pkg from '../../package.json';
import { selectsAll } from '../physics/constituent-selection';
import type { ProcessSettings, RecordResult } from '../physics/types';
import { encodeJets } from './export-lines';
import type { IngestHeader } from './header';
import type { JetLineStyle } from './types';
import type { BatchCounts, PipelineSummary, RecordMeta, ResultSink, WorkerFormat } from './pipeline/sink';

export const DECLUSTERINGS_FORMAT = 'splitfield-declusterings';
export const DECLUSTERINGS_VERSION = 1;
export const SOFTWARE_VERSION: string = (pkg as { version: string }).version;

/** Column order of a "primary" entry. */
export const PRIMARY_COLUMNS = ['lnInvDelta', 'lnKt', 'z', 'delta', 'kt', 'psi', 'm'] as const;
/** Column order of an "all" entry. */
export const ALL_COLUMNS = ['generation', 'lnInvDelta', 'lnKt', 'z'] as const;
/** e+e- samples: the same slots in energy and angle (PHYSICS.md "Lepton-collider (e+e-) events"). */
export const EE_PRIMARY_COLUMNS = ['lnInvTheta', 'lnKt', 'z', 'theta', 'kt', 'psi', 'm'] as const;
export const EE_ALL_COLUMNS = ['generation', 'lnInvTheta', 'lnKt', 'z'] as const;

export function jetLineStyle(s: Omit<ProcessSettings, 'content'>): JetLineStyle {
  return { fullTree: s.fullTree, ee: s.collision === 'ee', flavour: !!s.flavourTags };
}

/** The jet definition as the header states it (hadron-collider inclusive jets keep their original form). */
function headerJetDefinition(s: ProcessSettings): Record<string, unknown> {
  if (s.content !== 'events') return { algorithm: null, R: s.jet.R, jetsFound: false, note: 'each record is one jet, taken as given' };
  const exclusive = s.jet.exclusive ? { exclusive: s.jet.exclusive } : {};
  if (s.collision !== 'ee') return { algorithm: s.jet.algorithm, R: s.jet.R, recombination: 'E', ...exclusive };
  const ee = s.ee!;
  const radius = ee.algorithm === 'genkt' ? { R: s.jet.R, p: ee.p } : {};
  return { collision: 'ee', algorithm: ee.algorithm, ...radius, recombination: 'E', ...exclusive };
}

/**
 * The export's header object. It says what the file holds: `fullTree` is the processing setting (the whole C/A
 * tree was kept), `splittings` names the lists each jet line carries (`includeAll`: "all" too, by default when
 * the full tree was kept). For records that are single jets no jets were found: the jet definition names no
 * algorithm, only the R that sets ln(R/Δ) and SoftDrop's default R0.
 */
export function exportHeader(
  input: IngestHeader,
  s: ProcessSettings,
  inputName?: string,
  includeAll: boolean = s.fullTree,
): Record<string, unknown> {
  const ee = s.collision === 'ee';
  const extras: Record<string, unknown> = {};
  if (!selectsAll(s.particles)) extras.constituents = s.particles;
  if (s.flavourTags) extras.flavourTags = { method: 'ghost association', ghostScale: 1e-18, values: ['b', 'c', 'light'] };
  return {
    format: DECLUSTERINGS_FORMAT,
    version: DECLUSTERINGS_VERSION,
    content: s.content,
    jetDefinition: headerJetDefinition(s),
    cuts: ee ? { eMin: s.ee!.eMin, maxJets: s.jet.maxJets } : { ptMin: s.jet.ptMin, yMax: s.jet.yMax, maxJets: s.jet.maxJets },
    reclustering: ee ? 'ee-cambridge' : 'ca',
    ...extras,
    softDrop: { zCut: s.softDrop.zCut, beta: s.softDrop.beta, R0: s.softDrop.R0, mode: s.softDrop.mode ?? 'grooming' },
    multiplicityKtCut: s.multiplicityKtCut,
    fullTree: s.fullTree,
    splittings: includeAll ? ['primary', 'all'] : ['primary'],
    columns: ee
      ? { jet: ['E', 'theta', 'phi', 'm'], primary: [...EE_PRIMARY_COLUMNS], all: includeAll ? [...EE_ALL_COLUMNS] : undefined, sd: ['mg', 'zg', 'Rg'] }
      : { primary: [...PRIMARY_COLUMNS], all: includeAll ? [...ALL_COLUMNS] : undefined, sd: ['mg', 'zg', 'Rg'] },
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
export function formatJets(records: RecordMeta[], results: RecordResult[], style: JetLineStyle): string {
  return textDecoder.decode(encodeJets(records, results, style));
}

const textDecoder = new TextDecoder();

/** The bytes a sink's WorkerFormat asks for (made in the thread that processed the batch). */
export function formatForSink(f: WorkerFormat, records: RecordMeta[], results: RecordResult[]): Uint8Array {
  return encodeJets(records, results, f.style);
}

/**
 * Sink that writes the export to a stream, respecting backpressure. It does not end the stream. The export text
 * is made where each batch is processed (workerFormat), so that it scales with the threads.
 */
export class ExportWriter implements ResultSink {
  private style: JetLineStyle = { fullTree: false, ee: false, flavour: false };
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
    this.style = jetLineStyle(settings);
    this.workerFormat = { kind: 'export', style: this.style };
    await this.put(JSON.stringify(exportHeader(header, settings, this.opts.inputName)) + '\n');
  }

  async write(records: RecordMeta[], results: RecordResult[]): Promise<void> {
    for (const r of results) this.jetsWritten += r.jets.length;
    await this.put(encodeJets(records, results, this.style));
  }

  async writeFormatted(bytes: Uint8Array, counts: BatchCounts): Promise<void> {
    this.jetsWritten += counts.jets;
    await this.put(bytes);
  }

  async end(_summary: PipelineSummary): Promise<void> {}
}
