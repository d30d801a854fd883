// How samples look in API responses (the shapes of lib/samples/shapes.ts).
import type { StudyRole } from '@/models/vocabulary';
import type { LoadedSample } from './access';
import { completeSettings } from '../ingest/settings';
import type { SampleDetail, SampleProvenance, SampleSummary } from './shapes';

function personRef(user: LoadedSample['uploadedBy']) {
  return user ? { id: user.id, name: user.name } : null;
}

export function sampleSummary(sample: LoadedSample): SampleSummary {
  return {
    id: sample.id,
    name: sample.name,
    label: sample.label,
    description: sample.description,
    tags: sample.tags,
    studyId: sample.studyId,
    studyTitle: sample.study.title,
    state: sample.state,
    progress: sample.progress,
    counts: sample.counts,
    fileName: sample.fileName,
    fileSize: Number(sample.fileSize),
    createdAt: sample.createdAt.toISOString(),
    uploadedBy: personRef(sample.uploadedBy),
  };
}

export function sampleProvenance(sample: LoadedSample): SampleProvenance {
  return {
    sample: { id: sample.id, name: sample.name, label: sample.label, state: sample.state },
    study: { id: sample.study.id, title: sample.study.title },
    file: { name: sample.fileName, size: Number(sample.fileSize), sha256: sample.fileHash },
    input: sample.input,
    settings: completeSettings(sample.settings),
    software: { name: 'splitfield', version: sample.softwareVersion },
    uploadedBy: personRef(sample.uploadedBy),
    timings: {
      uploadedAt: sample.createdAt.toISOString(),
      uploadSeconds: sample.uploadMs / 1000,
      startedAt: sample.startedAt?.toISOString() ?? null,
      finishedAt: sample.finishedAt?.toISOString() ?? null,
      processingSeconds: sample.processingMs === null ? null : sample.processingMs / 1000,
    },
    counts: sample.counts,
    tree: sample.settings.fullTree ? 'full' : 'primary',
  };
}

export function sampleDetail(sample: LoadedSample, myRole: StudyRole | null): SampleDetail {
  return {
    ...sampleSummary(sample),
    settings: completeSettings(sample.settings),
    provenance: sampleProvenance(sample),
    error: sample.error,
    myRole,
  };
}
