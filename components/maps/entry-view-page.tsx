'use client';

import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import useSWR from 'swr';
import { sendJson, type ApiError } from '@/lib/api/client';
import { type ContrastSettings, contrastSettingsSchema, type MapSettings, mapSettingsSchema } from '@/lib/maps/entry-settings';
import type { StudyDetail } from '../api-types';
import { Button } from '../button';
import { EmptyState } from '../empty-state';
import { useMe } from '../hooks/use-me';
import { LoadingBlock } from '../loading-block';
import { MarkdownView } from '../markdown-view';
import { Notice } from '../notice';
import { studyPermissions } from '../study/permissions';
import { useDocumentTitle } from '../use-document-title';
import { ContrastView } from './contrast-view';
import { MapView } from './map-view';
import { entryPageUrl } from './view-urls';

/** The settings the page address holds, if they are valid for the entry's kind; else null (the saved ones are shown). */
function addressSettings(kind: 'map' | 'contrast', text: string | null): MapSettings | ContrastSettings | null {
  if (!text) return null;
  try {
    const parsed = (kind === 'map' ? mapSettingsSchema : contrastSettingsSchema).safeParse(JSON.parse(text));
    return parsed.success ? parsed.data : null;
  } catch {
    return null;
  }
}

/**
 * One Map or Contrast entry with every control. Its settings live in the page address, so the view can be linked
 * as it is; an editor saves them to the entry for everyone.
 */
export function EntryViewPage({ studyId, entryId, settingsText }: { studyId: string; entryId: string; settingsText: string | null }) {
  const router = useRouter();
  const { me } = useMe();
  const { data, error, mutate } = useSWR<StudyDetail, ApiError>(`/api/studies/${studyId}`);
  const [saveState, setSaveState] = useState<{ pending: boolean; error: string | null; saved: boolean }>({ pending: false, error: null, saved: false });
  const entry = data?.entries.find((e) => String(e.id) === entryId);
  useDocumentTitle(entry ? entry.title || (entry.kind === 'map' ? 'Map' : 'Contrast') : undefined);

  if (error) return <EmptyState title={error.status === 404 ? 'Study not found' : 'This study could not be opened'}>{error.message}</EmptyState>;
  if (!data || !me) return <LoadingBlock label="Loading…" />;
  if (!entry || (entry.kind !== 'map' && entry.kind !== 'contrast')) {
    return <EmptyState title="View not found">There is no map or contrast {entryId} in this study.</EmptyState>;
  }
  const kind = entry.kind;
  const saved = (kind === 'map' ? mapSettingsSchema : contrastSettingsSchema).safeParse(entry.settings);
  if (!saved.success) return <Notice tone="error">The saved settings of this entry cannot be read: {saved.error.issues[0]?.message}</Notice>;
  const fromAddress = addressSettings(kind, settingsText);
  const settings = fromAddress ?? saved.data;
  const changed = fromAddress !== null && JSON.stringify(fromAddress) !== JSON.stringify(saved.data);
  const { canEdit } = studyPermissions(me, data.myRole);

  const show = (next: MapSettings | ContrastSettings) => {
    setSaveState((s) => ({ ...s, saved: false }));
    router.replace(entryPageUrl(studyId, entry.id, next), { scroll: false });
  };

  async function save() {
    setSaveState({ pending: true, error: null, saved: false });
    try {
      await sendJson('PATCH', `/api/studies/${studyId}/entries/${entry!.id}`, { settings });
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
            · {kind === 'map' ? 'Map' : 'Contrast'}
          </p>
          <h1 className="text-2xl font-semibold tracking-tight">{entry.title || (kind === 'map' ? 'Map' : 'Contrast')}</h1>
        </div>
        <div className="flex flex-wrap items-center gap-2">
          {changed && <span className="text-xs text-ink-soft">Shown with settings from this address, not yet saved.</span>}
          {canEdit && (
            <Button variant="primary" size="sm" disabled={!changed || saveState.pending} onClick={save}>
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
      {kind === 'map' ? (
        <MapView settings={settings as MapSettings} onChange={show} regionsOf={{ studyId: data.study.id, entryId: entry.id }} />
      ) : (
        <ContrastView settings={settings as ContrastSettings} onChange={show} regionsOf={{ studyId: data.study.id, entryId: entry.id }} />
      )}
      <p className="text-xs text-ink-faint">This page’s address holds the view’s settings: copy it to share the view as you see it.</p>
    </div>
  );
}
