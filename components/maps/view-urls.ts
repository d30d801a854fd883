// Addresses of views: the API requests that compute them (and their exports), and the page that shows an entry with
// given settings, so that a view can be linked and opened by another member exactly as it was.
import type { ContrastSettings, DisplaySettings, MapSettings } from '@/lib/maps/entry-settings';
import type { ExportFormat } from '@/lib/maps/queries';
import type { PlaneView } from '@/lib/maps/view-settings';

const viewParam = (view: PlaneView) => JSON.stringify(view);

export function mapApiUrl(sampleId: number, view: PlaneView, format?: ExportFormat): string {
  const query = new URLSearchParams({ view: viewParam(view) });
  if (format) query.set('format', format);
  return `/api/samples/${sampleId}/map?${query}`;
}

export function contrastApiUrl(settings: Pick<ContrastSettings, 'sampleIds' | 'view' | 'mode' | 'minEntries'>, format?: ExportFormat): string {
  const query = new URLSearchParams({ samples: settings.sampleIds.join(','), view: viewParam(settings.view), mode: settings.mode, minEntries: String(settings.minEntries) });
  if (format) query.set('format', format);
  return `/api/contrasts?${query}`;
}

export function projectionApiUrl(sampleIds: number[], view: PlaneView, projection: NonNullable<DisplaySettings['projection']>, format?: ExportFormat): string {
  const query = new URLSearchParams({ samples: sampleIds.join(','), view: viewParam(view), onto: projection.onto });
  if (projection.from !== null) query.set('from', String(projection.from));
  if (projection.to !== null) query.set('to', String(projection.to));
  if (format) query.set('format', format);
  return `/api/projections?${query}`;
}

/** The page of an entry showing these settings (they override the saved ones until saved). */
export function entryPageUrl(studyId: number | string, entryId: number, settings?: object): string {
  const base = `/studies/${studyId}/entries/${entryId}`;
  return settings ? `${base}?${new URLSearchParams({ settings: JSON.stringify(settings) })}` : base;
}
