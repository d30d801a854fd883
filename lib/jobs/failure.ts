// A failed job's first error as the sample keeps it: the engine's message (which names the line), and what it
// means for the person who uploaded the file, in plain words.
import { IngestError } from '@/lib/ingest/errors';
import type { SampleError } from '@/models/sample-fields';

/** What crosses from the job's worker thread: an IngestError's code, message and line, or any other error's text. */
export interface JobErrorReport {
  code: string;
  message: string;
  line: number | null;
}

/** An error of a processing run as it crosses to the server. */
export function jobErrorReport(error: unknown): JobErrorReport {
  if (error instanceof IngestError) return { code: error.code, message: error.message, line: error.line };
  return { code: 'internal', message: error instanceof Error ? error.message : String(error), line: null };
}

const EXPLANATIONS: Record<string, string> = {
  header:
    'The file does not start the way a readable file does. A splitfield-particles file begins with its header line ' +
    '{"format":"splitfield-particles","version":1,"content":"events" or "jets",...}; a HepMC3 file with "HepMC::Version" ' +
    'and "HepMC::Asciiv3-START_EVENT_LISTING". Check that you chose the right file.',
  version: 'The file is written in a format version this server does not read. Write it again in the version named.',
  json: 'A line is not valid JSON: often a line cut short, or two records run together. Fix that line and upload again.',
  record:
    'A record lacks what a record needs (a "particles" list; "id", "weight", "pid", "charge" and the tag particles ' +
    'are optional) ' +
    'or has a field of the wrong kind.',
  particle:
    'A particle is not physical: a momentum component that is not a finite number, a negative energy, an energy below ' +
    'the momentum, or (for rapidity) an energy not above |pz|. Fix or drop that particle and upload again.',
  hepmc: 'A line of the HepMC3 event listing does not follow the HepMC3 ASCII format.',
  gzip:
    'The compressed file is damaged or incomplete, as happens when a copy or download stopped early. ' +
    'Compress or copy the file again, then upload it anew.',
  empty: 'The file holds no records (events or jets) to process: at least one must follow its header.',
  size:
    'A line is larger than the server reads at once. The one-document form is meant for small files: write large ' +
    'samples as JSON Lines, one record a line.',
  limit:
    'The file is larger than this server processes as one sample (too many records, or too much text once ' +
    'decompressed; an admin sets the limits: SPLITFIELD_MAX_RECORDS, SPLITFIELD_MAX_DECOMPRESSED_BYTES). Split it ' +
    'into several samples, or ask an admin.',
  io: 'The server could not read the stored upload. Upload the file again; if it happens again, tell an admin.',
  settings:
    'The processing settings need something this record does not carry: charged-only needs "charge" or "pid" for ' +
    'each particle, the pid lists and dropping neutrinos need "pid", flavour tags need whole events. Add it to the ' +
    'file, or upload again with other settings.',
  columnar:
    'The Parquet or Arrow file does not follow Splitfield\'s columnar schema (README "Columnar input"), or is ' +
    'incomplete, as happens when a copy stopped early. The message names the row group, the row and the column.',
  process: 'The physics engine could not process this record. Please report the file to an admin.',
  interrupted: 'The server stopped while this sample was being processed, and it was not resumed. Upload the file again.',
  internal: 'The processing job stopped because of an internal error. Please tell an admin; uploading again may help.',
};

export function sampleError(report: JobErrorReport): SampleError {
  const code = report.code in EXPLANATIONS ? report.code : 'internal';
  return { code, message: report.message, line: report.line, explanation: EXPLANATIONS[code] };
}
