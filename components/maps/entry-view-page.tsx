'use client';

import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import useSWR from 'swr';
import { sendJson, type ApiError } from '@/lib/api/client';
import { type ContrastSettings, contrastSettingsSchema, type MapSettings, mapSettingsSchema } from '@/lib/maps/entry-settings';
import { mayComment } from '@/lib/regions/rules';
import { type SavedRegion, type SeparationSettings, separationSettingsSchema } from '@/lib/separations/settings';
import type { StudyDetail } from '../api-types';
import { Button } from '../button';
import { EmptyState } from '../empty-state';
import { useMe } from '../hooks/use-me';
import { LoadingBlock } from '../loading-block';
import { MarkdownView } from '../markdown-view';
import { Notice } from '../notice';
import { studyPermissions } from '../study/permissions';
import { SeparationView } from '../separations/separation-view';
import { TaggerPanel } from '../separations/tagger-panel';
import { useDocumentTitle } from '../use-document-title';
import { ContrastView } from './contrast-view';
import { MapView } from './map-view';
import { entryPageUrl } from './view-urls';

const SCHEMAS = { map: mapSettingsSchema, contrast: contrastSettingsSchema, separation: separationSettingsSchema } as const;
const KIND_NAMES = { map: 'Map', contrast: 'Contrast', separation: 'Separation' } as const;
type ViewKind = keyof typeof SCHEMAS;
type ViewSettings = MapSettings | ContrastSettings | SeparationSettings;

/** The settings the page address holds, if they are valid for the entry's kind; else null (the saved ones are shown). */
function addressSettings(kind: ViewKind, text: string | null): ViewSettings | null {
  if (!text) return null;
  try {
    const parsed = SCHEMAS[kind].safeParse(JSON.parse(text));
    return parsed.success ? parsed.data : null;
  } catch {
    return null;
  }
}

/**
 * One Map, Contrast or Separation entry with every control. Its settings live in the page address, so the view can be linked
 * as it is; an editor saves them to the entry for everyone.
 */
export function EntryViewPage({ studyId, entryId, settingsText }: { studyId: string; entryId: string; settingsText: string | null }) {
  const router = useRouter();
  const { me } = useMe();
  const { data, error, mutate } = useSWR<StudyDetail, ApiError>(`/api/studies/${studyId}`);
  const [saveState, setSaveState] = useState<{ pending: boolean; error: string | null; saved: boolean }>({ pending: false, error: null, saved: false });
  const entry = data?.entries.find((e) => String(e.id) === entryId);
  const kind = entry && entry.kind !== 'note' ? (entry.kind as ViewKind) : null;
  useDocumentTitle(entry ? entry.title || (kind ? KIND_NAMES[kind] : 'Note') : undefined);

  if (error) return <EmptyState title={error.status === 404 ? 'Study not found' : 'This study could not be opened'}>{error.message}</EmptyState>;
  if (!data || !me) return <LoadingBlock label="Loading…" />;
  if (!entry || !kind) {
    return <EmptyState title="View not found">There is no map, contrast or separation {entryId} in this study.</EmptyState>;
  }
  const saved = SCHEMAS[kind].safeParse(entry.settings);
  if (!saved.success) return <Notice tone="error">The saved settings of this entry cannot be read: {saved.error.issues[0]?.message}</Notice>;
  const fromAddress = addressSettings(kind, settingsText);
  const settings = fromAddress ?? saved.data;
  const changed = fromAddress !== null && JSON.stringify(fromAddress) !== JSON.stringify(saved.data);
  const { canEdit } = studyPermissions(me, data.myRole);
  const regionsOf = { studyId: data.study.id, entryId: entry.id };

  const show = (next: ViewSettings) => {
    setSaveState((s) => ({ ...s, saved: false }));
    router.replace(entryPageUrl(studyId, entry.id, next), { scroll: false });
  };

  async function save(next: ViewSettings = settings) {
    setSaveState({ pending: true, error: null, saved: false });
    try {
      await sendJson('PATCH', `/api/studies/${studyId}/entries/${entry!.id}`, { settings: next });
      await mutate();
      setSaveState({ pending: false, error: null, saved: true });
      router.replace(entryPageUrl(studyId, entry!.id), { scroll: false });
    } catch (failure) {
      setSaveState({ pending: false, error: (failure as Error).message, saved: false });
    }
  }

  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-baseline justify-between gap-3">
        <div>
          <p className="text-xs uppercase tracking-wider text-ink-faint">
            <Link href={`/studies/${studyId}`} className="hover:underline">
              {data.study.title}
            </Link>{' '}
            · {KIND_NAMES[kind]}
          </p>
          <h1 className="text-2xl font-semibold tracking-tight">{entry.title || KIND_NAMES[kind]}</h1>
        </div>
        <div className="flex flex-wrap items-center gap-2">
          {changed && <span className="text-xs text-ink-soft">Shown with settings from this address, not yet saved.</span>}
          {canEdit && (
            <Button variant="primary" size="sm" disabled={!changed || saveState.pending} onClick={() => save()}>
              {saveState.pending ? 'Saving…' : 'Save to the entry'}
            </Button>
          )}
          {changed && (
            <Button size="sm" variant="ghost" onClick={() => router.replace(entryPageUrl(studyId, entry.id), { scroll: false })}>
              Back to the saved view
            </Button>
          )}
        </div>
      </div>
      {saveState.error && <Notice tone="error">{saveState.error}</Notice>}
      {saveState.saved && <Notice tone="success">Saved: everyone in the study now sees these settings.</Notice>}
      {entry.body && <MarkdownView source={entry.body} />}
      {kind === 'map' && <MapView settings={settings as MapSettings} onChange={show} regionsOf={regionsOf} />}
      {kind === 'contrast' && <ContrastView settings={settings as ContrastSettings} onChange={show} regionsOf={regionsOf} />}
      {kind === 'separation' && (
        <>
          <SeparationView
            settings={settings as SeparationSettings}
            onChange={show}
            regionsOf={regionsOf}
            mayMakeRegions={mayComment({ id: me.id, siteRole: me.siteRole, myRole: data.myRole })}
            // A saved region joins the settings shown, which are saved with it.
            onSaveRegion={canEdit ? (region: SavedRegion) => save({ ...(settings as SeparationSettings), savedRegions: [...(settings as SeparationSettings).savedRegions, region] }) : null}
          />
          <section className="space-y-2" aria-label="Taggers">
            <h2 className="text-base font-semibold">Taggers</h2>
            <p className="text-xs text-ink-faint">
              A tagger keeps this entry’s saved binning, selection, ln-ratio table and working points{changed ? ' (save the settings shown first to keep them)' : ''}; it scores any sample you can see.
            </p>
            <TaggerPanel studyId={studyId} entryId={entry.id} canEdit={canEdit} />
          </section>
        </>
      )}
      <p className="text-xs text-ink-faint">This page’s address holds the view’s settings: copy it to share the view as you see it.</p>
    </div>
  );
}
