'use client';

// The regions of the plane a view shows: tools to draw a rectangle or polygon on the figure or to type its corners
// (commenters and above), the list of regions with their live numbers, state and category colour, and the selected
// region's thread. Mounted by any view with a workspace (use-regions-workspace.ts) and the planes it shows.
import { useMemo, useState } from 'react';
import useSWR from 'swr';
import { type ApiError, messageOf, sendJson } from '@/lib/api/client';
import { type Actor, mayChangeRegion, mayComment, mayManageCategories } from '@/lib/regions/rules';
import type { RegionView } from '@/lib/regions/shapes';
import type { StudyDetail } from '../api-types';
import { Button } from '../button';
import { countOf, formatDateTime } from '../format';
import { useMe } from '../hooks/use-me';
import { Notice } from '../notice';
import { formatValue, formatWithError } from '../plane/value-format';
import { pill } from '../role-badge';
import { CategoryEditor } from './category-editor';
import { NewRegionForm } from './new-region-form';
import { type RegionNumbers, type RegionPlane, regionNumbers } from './region-numbers';
import { RegionThread } from './region-thread';
import { describeShape } from './shape-text';
import { TypedShapeForm } from './typed-shape-form';
import { UNCATEGORISED_COLOUR, type RegionsWorkspace } from './use-regions-workspace';

interface RegionsPanelProps {
  workspace: RegionsWorkspace;
  /** The samples the view shows, on its bins: the first is the reference of the ratios. */
  planes: readonly RegionPlane[];
  xLabel: string;
  yLabel: string;
}

const DRAW_HINTS = {
  rectangle: 'Drag on the figure to draw the rectangle.',
  polygon: 'Click the corners on the figure; double-click, press Enter or click the first corner to close it. Backspace removes the last corner, Escape starts again.',
} as const;

export function RegionsPanel({ workspace, planes, xLabel, yLabel }: RegionsPanelProps) {
  const { me } = useMe();
  const { data: study } = useSWR<StudyDetail, ApiError>(`/api/studies/${workspace.studyId}`);
  const [typing, setTyping] = useState(false);
  const members = useMemo(() => (study?.members ?? []).map((m) => ({ userId: m.userId, name: m.name })), [study]);
  const numbers = useMemo(() => new Map(workspace.regions.map((region) => [region.id, regionNumbers(region.geometry.shape, planes)])), [workspace.regions, planes]);
  if (!me || !study) return null;
  const actor: Actor = { id: me.id, siteRole: me.siteRole, myRole: study.myRole };
  const { drawMode, pending } = workspace;
  const selected = workspace.regions.find((region) => region.id === workspace.selectedId) ?? null;

  return (
    <section id="regions" aria-label="Regions" className="space-y-3 rounded-md border border-ink/10 p-3 text-sm">
      <div className="flex flex-wrap items-center gap-2">
        <h3 className="font-semibold">Regions</h3>
        <span className="text-xs text-ink-soft">
          {countOf(workspace.regions.length, 'region')} on this plane{workspace.elsewhere > 0 && `, ${workspace.elsewhere} on other planes of the study`}
        </span>
        {mayComment(actor) && (
          <div className="ml-auto flex flex-wrap gap-1">
            {(['rectangle', 'polygon'] as const).map((mode) => (
              <Button key={mode} size="sm" aria-pressed={drawMode === mode} variant={drawMode === mode ? 'primary' : 'secondary'} onClick={() => workspace.setDrawMode(drawMode === mode ? null : mode)}>
                Draw a {mode}
              </Button>
            ))}
            <Button size="sm" aria-pressed={typing} onClick={() => setTyping(!typing)}>
              Type corners
            </Button>
          </div>
        )}
      </div>
      {drawMode && <Notice>{DRAW_HINTS[drawMode]}</Notice>}
      {typing && !pending && (
        <TypedShapeForm
          axes={workspace.axes}
          xLabel={xLabel}
          yLabel={yLabel}
          onShape={(shape) => {
            workspace.setPending(shape);
            setTyping(false);
          }}
        />
      )}
      {pending && (
        <NewRegionForm
          studyId={workspace.studyId}
          entryId={workspace.entryId}
          geometry={{ axes: workspace.axes, shape: pending }}
          shapeText={describeShape(pending, xLabel, yLabel)}
          categories={workspace.categories}
          members={members}
          onCancel={() => workspace.setPending(null)}
          onCreated={(region) => {
            workspace.setPending(null);
            workspace.select(region.id);
          }}
        />
      )}
      {workspace.error && <Notice tone="error">{workspace.error.message}</Notice>}
      {workspace.regions.length > 0 && (
        <ul className="divide-y divide-ink/10" aria-label="Regions on this plane">
          {workspace.regions.map((region) => (
            <li key={region.id}>
              <RegionRow region={region} numbers={numbers.get(region.id)!} selected={region.id === workspace.selectedId} onSelect={() => workspace.select(region.id === workspace.selectedId ? null : region.id)} />
            </li>
          ))}
        </ul>
      )}
      {selected && (
        <RegionDetail key={selected.id} region={selected} actor={actor} members={members} shapeText={describeShape(selected.geometry.shape, xLabel, yLabel)} onChanged={workspace.refresh} onDeleted={() => workspace.select(null)} />
      )}
      {mayManageCategories(actor) && <CategoryEditor studyId={workspace.studyId} categories={workspace.categories} onChanged={() => void workspace.refresh()} />}
    </section>
  );
}

function StateBadge({ state }: { state: RegionView['state'] }) {
  return <span className={`${pill} ${state === 'open' ? 'border-warn/30 bg-warn-soft text-warn' : 'border-accent/30 bg-accent-soft text-accent-strong'}`}>{state}</span>;
}

function RegionRow({ region, numbers, selected, onSelect }: { region: RegionView; numbers: RegionNumbers; selected: boolean; onSelect: () => void }) {
  const colour = region.category?.colour ?? UNCATEGORISED_COLOUR;
  return (
    <button type="button" onClick={onSelect} aria-expanded={selected} className={`w-full space-y-1 px-1 py-2 text-left hover:bg-paper-sunk ${selected ? 'bg-paper-sunk' : ''}`} data-testid="region-row">
      <span className="flex flex-wrap items-center gap-2">
        <span aria-hidden className="inline-block h-3 w-3 rounded-sm border border-ink/20" style={{ backgroundColor: colour }} />
        <span className="font-medium">{region.title}</span>
        <StateBadge state={region.state} />
        <span className="text-xs text-ink-soft">{region.category?.name ?? 'No category'}</span>
        <span className="ml-auto text-xs text-ink-faint">{countOf(region.commentCount, 'comment')}</span>
      </span>
      <span className="block font-mono text-xs text-ink-soft" data-testid="region-numbers">
        ∫ρ inside, splittings per jet: {numbers.integrals.map(({ sample, integral }) => `${sample.label || sample.name} ${formatWithError(integral.value, Math.sqrt(integral.variance))}`).join('; ')}
        {numbers.ratios.map((r) => `; ratio ${r.sample.label || r.sample.name}/${r.reference.label || r.reference.name} = ${formatWithError(r.value, r.error)}`).join('')}
        {numbers.covered < 0.999 && ` (only ${formatValue(numbers.covered * 100, 2)}% of the region lies in the shown range)`}
      </span>
    </button>
  );
}

function RegionDetail({ region, actor, members, shapeText, onChanged, onDeleted }: { region: RegionView; actor: Actor; members: Array<{ userId: number; name: string }>; shapeText: string; onChanged: () => Promise<unknown>; onDeleted: () => void }) {
  const [error, setError] = useState<string | null>(null);
  const url = `/api/studies/${region.studyId}/regions/${region.id}`;
  async function run(work: () => Promise<unknown>) {
    setError(null);
    try {
      await work();
      await onChanged();
    } catch (failure) {
      setError(messageOf(failure));
    }
  }
  return (
    <div className="space-y-3 border-t border-ink/10 pt-3" aria-label={`Region ${region.title}`} role="region">
      <div className="flex flex-wrap items-center gap-2">
        <h4 className="font-semibold">{region.title}</h4>
        <StateBadge state={region.state} />
        {mayComment(actor) && (
          <Button size="sm" onClick={() => run(() => sendJson('PATCH', url, { state: region.state === 'open' ? 'resolved' : 'open' }))}>
            {region.state === 'open' ? 'Resolve' : 'Reopen'}
          </Button>
        )}
        {mayChangeRegion(actor, region.createdBy?.id ?? null) && (
          <Button size="sm" variant="ghost" onClick={() => run(async () => (await sendJson('DELETE', url), onDeleted()))}>
            Delete region
          </Button>
        )}
      </div>
      <p className="text-xs text-ink-soft">
        Drawn by {region.createdBy?.name ?? 'a former member'} on {formatDateTime(region.createdAt)}
        {region.stateChangedAt && `; ${region.state === 'resolved' ? 'resolved' : 'reopened'} by ${region.stateChangedBy?.name ?? 'a former member'} on ${formatDateTime(region.stateChangedAt)}`}. {shapeText}.
      </p>
      {error && <Notice tone="error">{error}</Notice>}
      <RegionThread studyId={region.studyId} regionId={region.id} actor={actor} members={members} />
    </div>
  );
}
