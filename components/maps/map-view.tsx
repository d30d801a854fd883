'use client';

import { useCallback, useMemo, useRef } from 'react';
import useSWR from 'swr';
import type { ApiError } from '@/lib/api/client';
import { axisLabel, densityLabel, TREE_LABELS } from '@/lib/maps/axis-labels';
import type { MapSettings } from '@/lib/maps/entry-settings';
import type { MapResult } from '@/lib/maps/shapes';
import type { AxisChoice } from '@/lib/physics/plane/axes';
import { Button } from '../button';
import { axesOfView } from '@/lib/regions/geometry-schema';
import { LoadingBlock } from '../loading-block';
import { Notice } from '../notice';
import { sequentialDomain } from '../plane/colour-scale';
import { PlaneFigure } from '../plane/plane-figure';
import { RegionsPanel } from '../regions/regions-panel';
import { useRegionsWorkspace } from '../regions/use-regions-workspace';
import { ExportMenu } from './export-menu';
import { JetSummaryPanel } from './jet-summary-panel';
import { OutsideNote } from './outside-note';
import { overlaysFor } from './overlays';
import { ProjectionPanel } from './projection-panel';
import { ViewControls } from './view-controls';
import { mapApiUrl } from './view-urls';

/** A filter refusal from the server, which belongs at the filter field. */
export function filterRefusal(error: ApiError | undefined): string | null {
  return error && error.status === 400 && /^The filter/.test(error.message) ? error.message : null;
}

interface MapViewProps {
  settings: MapSettings;
  onChange?: (next: MapSettings) => void;
  /** Without controls, projection and downloads: the figure and one line (an entry in the study's list). */
  compact?: boolean;
  /** The study entry shown: its study's regions of this plane are drawn, listed and discussed (not when compact). */
  regionsOf?: { studyId: number; entryId: number | null };
}

/** A Map: one sample's per-jet density on a plane, with its controls, overlays, summary, projection and downloads. */
export function MapView({ settings, onChange, compact = false, regionsOf }: MapViewProps) {
  const { data, error, isLoading } = useSWR<MapResult, ApiError>(mapApiUrl(settings.sampleId, settings.view), { keepPreviousData: true });
  const figure = useRef<Element | null>(null);
  const keepFigure = useCallback((element: Element | null) => {
    figure.current = element;
  }, []);
  const { view, display } = settings;
  const serverFilterError = filterRefusal(error);
  // The address is parsed again on every navigation: equal settings must not redraw the figure (and lose the hover).
  const displayKey = JSON.stringify(display);

  const drawn = useMemo(() => {
    if (!data) return null;
    const x = data.view.x as AxisChoice;
    const y = data.view.y as AxisChoice;
    const xRange: [number, number] = [data.bins.x.min, data.bins.x.max];
    const yRange: [number, number] = [data.bins.y.min, data.bins.y.max];
    return {
      grid: { xEdges: data.plane.xEdges, yEdges: data.plane.yEdges, values: data.plane.density, errors: data.plane.error, counts: data.plane.count },
      colour: {
        scheme: 'ember' as const,
        type: display.colour,
        domain: sequentialDomain([data.plane.density], display.colour),
        label: densityLabel(x, y, false, data.sample.collision),
      },
      xLabel: axisLabel(x, data.sample.collision),
      yLabel: axisLabel(y, data.sample.collision),
      overlays: overlaysFor(data.view, display, data.sample.R, data.jets.medianPt, xRange, yRange),
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [data, displayKey]);

  const place = regionsOf && !compact ? { ...regionsOf, axes: axesOfView(data?.view ?? view) } : null;
  const regions = useRegionsWorkspace(place);
  const planes = useMemo(() => (data ? [{ sample: data.sample, plane: data.plane }] : []), [data]);

  const title = data ? `${data.sample.name}: ${TREE_LABELS[data.view.tree]}` : '';
  const change = (next: Partial<MapSettings>) => onChange?.({ ...settings, ...next });

  return (
    <div className="space-y-3">
      {!compact && onChange && (
        <ViewControls
          view={view}
          display={display}
          onView={(next) => change({ view: next })}
          onDisplay={(next) => change({ display: next })}
          serverFilterError={serverFilterError}
          collision={data?.sample.collision}
        />
      )}
      {error && !serverFilterError && <Notice tone="error">{error.message}</Notice>}
      {!data && !error && <LoadingBlock label="Drawing the map…" />}
      {data && drawn && (
        <div aria-busy={isLoading} className={isLoading ? 'opacity-60' : undefined}>
          <PlaneFigure
            grid={drawn.grid}
            colour={drawn.colour}
            xLabel={drawn.xLabel}
            yLabel={drawn.yLabel}
            valueName="ρ"
            lines={drawn.overlays.lines}
            contours={drawn.overlays.contours}
            compact={compact}
            legend
            figureRef={keepFigure}
            {...regions?.figure}
          />
          <OutsideNote outside={data.outside} splittingsPerJet={data.splittingsPerJet} />
          {!compact && drawn.overlays.caption.map((line) => (
            <p key={line} className="text-xs text-ink-soft">
              {line}
            </p>
          ))}
          <p className="text-xs text-ink-faint">
            {data.source === 'cache' ? 'Rebinned from the fine histogram cached at processing.' : 'Computed from the stored splittings for this selection.'}
          </p>
        </div>
      )}
      {data && !compact && (
        <>
          {regions && drawn && <RegionsPanel workspace={regions} planes={planes} xLabel={drawn.xLabel} yLabel={drawn.yLabel} />}
          <ExportMenu url={(format) => mapApiUrl(settings.sampleId, settings.view, format)} figure={() => figure.current} title={title} baseName={`map-${settings.sampleId}`} />
          {display.projection ? (
            <ProjectionPanel
              sampleIds={[settings.sampleId]}
              view={data.view}
              projection={display.projection}
              overlays={display.overlays}
              onChange={(projection) => change({ display: { ...display, projection } })}
              title={`${title}, projection`}
            />
          ) : (
            onChange && (
              <Button size="sm" onClick={() => change({ display: { ...display, projection: { onto: 'y', from: null, to: null } } })}>
                Show a projection
              </Button>
            )
          )}
          <JetSummaryPanel sample={data.sample} jets={data.jets} summary={data.summary} />
        </>
      )}
    </div>
  );
}
