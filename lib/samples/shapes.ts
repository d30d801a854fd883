// The sample API's JSON shapes (DEVELOPERS.md "Samples API"): what routes answer and pages read. Types only, no
// imports with runtime code, so client components may import them.
import type { ProcessSettings } from '@/lib/physics/types';
import type { SampleState, StudyRole } from '@/models/vocabulary';

/**
 * Processing settings of a sample: jet definition and cuts, SoftDrop, multiplicity kt cut, and `fullTree` (store
 * every splitting of the C/A tree, needed for `export?all=1`). `content` is not among them: the header gives it.
 */
export type SampleSettings = Omit<ProcessSettings, 'content'>;

/** How far a job is; null fields are not known yet. */
export interface SampleProgress {
  /** Bytes of the upload read so far over its size: 0..1. */
  fraction: number;
  bytesRead: number;
  bytesTotal: number;
  records: number;
  jets: number;
  /** Primary splittings (all splittings when the full tree is stored). */
  splittings: number;
  jetsPerSecond: number;
  recordsPerSecond: number;
  elapsedSeconds: number;
  /** Estimated seconds left, from the fraction read so far; null until a little has been read. */
  secondsLeft: number | null;
}

/** What processing found; set when the job is done. */
export interface SampleCounts {
  records: number;
  particles: number;
  /** Jets kept by the selection. */
  jets: number;
  /** Jets found but dropped, by the first cut that failed: pt, |y|, leading-N rank. */
  jetsRejected: { pt: number; y: number; rank: number };
  primarySplittings: number;
  /** Every splitting of the C/A trees; 0 unless the full tree is stored. */
  allSplittings: number;
}

/** Why a job failed: the first error, where it is, and what it means in plain words. */
export interface SampleError {
  /** Programs' code: e.g. 'header', 'json', 'record', 'particle', 'gzip', 'empty', 'size', 'hepmc', 'interrupted'. */
  code: string;
  /** The engine's message, with its position ("line 50000, particle 3: ..."). */
  message: string;
  /** 1-based line (or record in the one-document form) of the problem; null when the whole file is concerned. */
  line: number | null;
  explanation: string;
}

/** What the file's header said (set once the job has read it). */
export interface SampleInput {
  format: string;
  version: number | string;
  layout: 'jsonl' | 'document' | 'ascii';
  gzip: boolean;
  content: 'events' | 'jets';
  momentum: string;
  energyUnit: string;
  sample: { name?: string; label?: string; description?: string; tags?: string[] };
  metadata: Record<string, unknown>;
}

export interface PersonRef {
  id: number;
  name: string;
}

/** A sample in lists (GET /api/samples). Dates are ISO strings in JSON. */
export interface SampleSummary {
  id: number;
  name: string;
  label: string;
  description: string;
  tags: string[];
  studyId: number;
  studyTitle: string;
  state: SampleState;
  progress: SampleProgress | null;
  counts: SampleCounts | null;
  fileName: string;
  fileSize: number;
  createdAt: string;
  uploadedBy: PersonRef | null;
}

/** One sample with everything (GET /api/samples/[sampleId]). */
export interface SampleDetail extends SampleSummary {
  settings: SampleSettings;
  provenance: SampleProvenance;
  error: SampleError | null;
  /** The caller's role in the sample's study; null for a site admin who is not a member. */
  myRole: StudyRole | null;
}

/** Where a sample came from and how it was made (GET …/provenance). */
export interface SampleProvenance {
  sample: { id: number; name: string; label: string; state: SampleState };
  study: { id: number; title: string };
  file: { name: string; size: number; sha256: string };
  input: SampleInput | null;
  settings: SampleSettings;
  software: { name: 'splitfield'; version: string | null };
  uploadedBy: PersonRef | null;
  timings: {
    uploadedAt: string;
    uploadSeconds: number;
    startedAt: string | null;
    finishedAt: string | null;
    processingSeconds: number | null;
  };
  counts: SampleCounts | null;
  /** Stored splittings: 'primary' or 'full' (the whole C/A tree). */
  tree: 'primary' | 'full';
}

/** A row of GET …/jets: `record` is the record's id as text, `jet` its index in the record by pt. */
export interface JetRowView {
  row: number;
  record: string;
  jet: number;
  weight: number;
  pt: number;
  y: number;
  phi: number;
  m: number;
  n: number;
  /** SoftDrop groomed mass, z_g and R_g: null when no splitting passed. */
  mg: number | null;
  zg: number | null;
  Rg: number | null;
  mult: number;
}

/** GET …/plane: `density[iy * nx + ix]` with nx = xEdges.length − 1. */
export interface PlaneView {
  horizontal: 'lnInvDelta' | 'lnRoverDelta';
  xEdges: number[];
  yEdges: number[];
  density: number[];
  variance: number[];
  jetWeight: number;
  jetCount: number;
}

export interface ApiTokenView {
  id: number;
  name: string;
  /** The first characters of the secret, to tell tokens apart. */
  prefix: string;
  createdAt: string;
  lastUsedAt: string | null;
}
