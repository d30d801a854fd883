'use client';

import { useState } from 'react';
import { type MapSettings, mapSettingsSchema } from '@/lib/maps/entry-settings';
import { MapView } from '../maps/map-view';
import { Panel } from '../panel';

/** A sample's primary plane on its own page: a Map view with every control, not saved anywhere. */
export function PlanePanel({ sampleId }: { sampleId: number }) {
  const [settings, setSettings] = useState<MapSettings>(() => mapSettingsSchema.parse({ sampleId }));
  return (
    <Panel title="Primary plane" lead="Add it to a study as a Map to keep these settings and share them.">
      <MapView settings={settings} onChange={setSettings} />
    </Panel>
  );
}
