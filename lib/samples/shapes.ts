// The sample API's JSON shapes (DEVELOPERS.md "Samples API"): what routes answer and pages read. Types only, no
// imports with runtime code, so client components may import them.
import type { CompleteSampleSettings, SampleCounts, SampleError, SampleInput, SampleProgress } from '@/models/sample-fields';
import type { SampleState, StudyRole } from '@/models/vocabulary';

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
  settings: CompleteSampleSettings;
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
  settings: CompleteSampleSettings;
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
  /** SoftDrop groomed mass, z_g and R_g: null when the jet failed SoftDrop in tagging mode (or, for samples processed
   * before grooming mode, when no splitting passed). */
  mg: number | null;
  zg: number | null;
  Rg: number | null;
  mult: number;
  /** Flavour tag "b", "c" or "light"; null when the sample has no flavour tags. */
  flavour: 'b' | 'c' | 'light' | null;
  /** Energy and polar angle (GeV, rad). */
  E: number;
  theta: number;
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
