// Shapes of the JSON fields stored on a sample row (settings, progress, counts, error, input header). They live
// beside the model that stores them so that lower layers never import from lib/samples; types only, so client
// code may import them.
import type { ProcessSettings, RemovedParticles } from '@/lib/physics/types';

/**
 * Processing settings of a sample: jet definition and cuts, SoftDrop, multiplicity kt cut, and `fullTree` (store
 * every splitting of the C/A tree, needed for `export?all=1`). `content` is not among them: the header gives it.
 */
export type SampleSettings = Omit<ProcessSettings, 'content'>;

/** Settings as stored and as the API answers: every field filled (lib/ingest/settings.ts). */
export type CompleteSampleSettings = Required<SampleSettings>;

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
  /** Particles removed by the constituent selection, by rule; missing or null without a selection. */
  particlesRemoved?: RemovedParticles | null;
  /** Kept jets by flavour tag; missing or null without flavour tags. */
  flavours?: { b: number; c: number; light: number } | null;
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
  layout: 'jsonl' | 'document' | 'ascii' | 'parquet-lists' | 'parquet-flat' | 'arrow-lists' | 'arrow-flat';
  gzip: boolean;
  content: 'events' | 'jets';
  momentum: string;
  energyUnit: string;
  sample: { name?: string; label?: string; description?: string; tags?: string[] };
  metadata: Record<string, unknown>;
}
