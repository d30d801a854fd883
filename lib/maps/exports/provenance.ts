// Where a view's numbers come from: the samples (file hashes, processing settings, the software that processed
// them), the view's own settings, and the software that made the export.
import { SOFTWARE_VERSION } from '@/lib/ingest/export';
import type { Sample } from '@/models/sample';
import type { PlaneView } from '../view-settings';

export function viewProvenance(kind: 'map' | 'contrast' | 'projection', samples: Sample[], view: PlaneView, options: Record<string, unknown> = {}) {
  return {
    kind,
    software: { name: 'splitfield', version: SOFTWARE_VERSION },
    exportedAt: new Date().toISOString(),
    view,
    options,
    samples: samples.map((sample) => ({
      id: sample.id,
      name: sample.name,
      label: sample.label,
      file: { name: sample.fileName, size: Number(sample.fileSize), sha256: sample.fileHash },
      settings: sample.settings,
      processedWith: { name: 'splitfield', version: sample.softwareVersion },
      processedAt: sample.finishedAt?.toISOString() ?? null,
    })),
  };
}
