// How a view names the samples it shows.
import type { Sample } from '@/models/sample';
import type { SampleRef } from './shapes';

export function sampleRef(sample: Sample): SampleRef {
  return {
    id: sample.id,
    name: sample.name,
    label: sample.label,
    tags: sample.tags,
    studyId: sample.studyId,
    fileHash: sample.fileHash,
    R: sample.settings.jet.R,
    collision: sample.settings.collision ?? 'hadron',
    tree: sample.settings.fullTree ? 'full' : 'primary',
    softDrop: { ...sample.settings.softDrop, mode: sample.settings.softDrop.mode ?? 'grooming' },
    multiplicityKtCut: sample.settings.multiplicityKtCut,
    processingRejected: sample.counts?.jetsRejected ?? null,
    softwareVersion: sample.softwareVersion,
  };
}
