'use client';

import Link from 'next/link';
import { contrastSettingsSchema, mapSettingsSchema } from '@/lib/maps/entry-settings';
import { separationSettingsSchema } from '@/lib/separations/settings';
import type { Entry } from '../api-types';
import { buttonClass } from '../button';
import { ContrastView } from '../maps/contrast-view';
import { MapView } from '../maps/map-view';
import { entryPageUrl } from '../maps/view-urls';
import { MarkdownView } from '../markdown-view';
import { SeparationView } from '../separations/separation-view';
import { Notice } from '../notice';
import { EntryActionButtons, EntryHeader, type EntryActions } from './entry-card-parts';

const KIND_NAMES = { map: 'Map', contrast: 'Contrast', separation: 'Separation' } as const;
const SCHEMAS = { map: mapSettingsSchema, contrast: contrastSettingsSchema, separation: separationSettingsSchema } as const;

/** A Map, Contrast or Separation entry in the study's list: its figure with the saved settings, a caption, and a link to open it. */
export function ViewCard({ studyId, entry, actions }: { studyId: string; entry: Entry; actions?: EntryActions }) {
  const kind = entry.kind as keyof typeof KIND_NAMES;
  const parsed = SCHEMAS[kind].safeParse(entry.settings);
  const label = entry.title || KIND_NAMES[kind];
  return (
    <article className="rounded-lg border border-ink/10 bg-paper-raised" aria-label={label}>
      <EntryHeader entry={entry} kind={kind} />
      <div className="space-y-3 px-5 py-4">
        {!parsed.success && <Notice tone="error">The saved settings of this entry cannot be read: {parsed.error.issues[0]?.message}</Notice>}
        {parsed.success && kind === 'map' && <MapView settings={mapSettingsSchema.parse(entry.settings)} compact />}
        {parsed.success && kind === 'contrast' && <ContrastView settings={contrastSettingsSchema.parse(entry.settings)} compact />}
        {parsed.success && kind === 'separation' && <SeparationView settings={separationSettingsSchema.parse(entry.settings)} compact />}
        {entry.body && <MarkdownView source={entry.body} />}
        <Link href={entryPageUrl(studyId, entry.id)} className={buttonClass('secondary', 'sm')}>
          Open {KIND_NAMES[kind].toLowerCase()}
        </Link>
      </div>
      {actions && <EntryActionButtons actions={actions} what={kind} />}
    </article>
  );
}
