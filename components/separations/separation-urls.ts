// The API request that computes a Separation with an entry's settings.
import type { SeparationSettings } from '@/lib/separations/settings';

export function separationApiUrl(settings: Pick<SeparationSettings, 'signalSampleId' | 'backgroundSampleId' | 'view' | 'minEntries'>): string {
  const query = new URLSearchParams({
    signal: String(settings.signalSampleId),
    background: String(settings.backgroundSampleId),
    view: JSON.stringify(settings.view),
    minEntries: String(settings.minEntries),
  });
  return `/api/separations?${query}`;
}
