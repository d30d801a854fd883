// Shapes of the sample and token API responses the pages read (issue 4's API contract).

import type { StudyRole } from '../api-types';

export const SAMPLE_STATES = ['queued', 'running', 'done', 'failed', 'cancelled'] as const;
export type SampleState = (typeof SAMPLE_STATES)[number];

export type JetAlgorithm = 'antikt' | 'kt' | 'ca';

/** Processing settings as the upload form sends them and the sample reports them. */
export interface SampleSettings {
  algorithm: JetAlgorithm;
  R: number;
  ptMin: number;
  yMax: number;
  /** Keep at most this many leading jets per record; null keeps all. */
  maxJets: number | null;
  zCut: number;
  beta: number;
  R0: number;
  ktCut: number;
}

export interface SampleProgress {
  recordsRead: number;
  jets: number;
  splittings: number;
  bytesRead: number;
  bytesTotal: number | null;
  elapsedMs: number;
}

export interface SampleCounts {
  records: number;
  jets: number;
  splittings: number;
  /** Jets found but dropped, by the first cut that failed. */
  rejected: { pt: number; y: number; rank: number };
}

export interface SampleSummary {
  id: number;
  name: string;
  label: string | null;
  description: string | null;
  tags: string[];
  studyId: number;
  studyTitle: string;
  state: SampleState;
  progress: SampleProgress | null;
  counts: SampleCounts | null;
  fileName: string;
  fileSize: number;
  createdAt: string;
  uploadedBy: { id: number; name: string } | null;
}

export interface SampleFailure {
  message: string;
  line: number | null;
  particle: number | null;
  explanation: string | null;
}

export interface SampleDetail extends SampleSummary {
  settings: SampleSettings;
  provenance: Record<string, unknown> | null;
  error: SampleFailure | null;
  myRole: StudyRole | null;
}

export interface JetRow {
  row: number;
  record: string | number;
  jet: number;
  weight: number;
  pt: number;
  y: number;
  phi: number;
  m: number;
  n: number;
  mg: number | null;
  zg: number | null;
  Rg: number | null;
  mult: number;
}

export interface JetPage {
  total: number;
  jets: JetRow[];
}

export type HorizontalCoordinate = 'lnInvDelta' | 'lnRoverDelta';

export interface PlaneDensity {
  xEdges: number[];
  yEdges: number[];
  /** Row-major: the bin (ix, iy) is at iy * nx + ix. */
  density: number[];
  variance: number[];
  jetWeight: number;
  jetCount: number;
}

export interface ApiToken {
  id: number;
  name: string;
  prefix: string;
  createdAt: string;
  lastUsedAt: string | null;
}
