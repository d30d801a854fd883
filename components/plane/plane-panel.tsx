'use client';

import { useState } from 'react';
import useSWR from 'swr';
import type { ApiError } from '@/lib/fetcher';
import { EmptyState } from '../empty-state';
import { LoadingBlock } from '../loading-block';
import { Notice } from '../notice';
import { Panel } from '../panel';
import { formatCount } from '../samples/numbers';
import type { HorizontalCoordinate, PlaneDensity } from '../samples/sample-types';
import { DensityFigure } from './density-figure';
import { PlaneControls } from './plane-controls';
import { DEFAULT_BIN_SIZE, horizontalOf, planeUrl, type PlaneView } from './plane-view-settings';

/** A first look at a sample's primary emission plane, with the coordinate and bin size to choose. */
export function PlanePanel({ sampleId }: { sampleId: number }) {
  const [view, setView] = useState<PlaneView>({ horizontal: 'lnInvDelta', binSize: DEFAULT_BIN_SIZE });
  // While a new view loads, the old map stays on screen with the axis it was drawn for.
  const [drawnHorizontal, setDrawnHorizontal] = useState<HorizontalCoordinate>(view.horizontal);
  const { data, error, isLoading } = useSWR<PlaneDensity, ApiError>(planeUrl(sampleId, view), {
    keepPreviousData: true,
    onSuccess: (_map, key) => setDrawnHorizontal(horizontalOf(key)),
  });
  const empty = data && !data.density.some((value) => value > 0);
  return (
    <Panel title="Primary plane" aside={data && `${formatCount(data.jetCount)} jets`}>
      <div className="space-y-3">
        <PlaneControls view={view} onChange={setView} />
        {error && <Notice tone="error">{error.message}</Notice>}
        {!data && !error && <LoadingBlock label="Drawing the plane…" />}
        {empty && <EmptyState title="No splittings in this range">The kept jets have no primary splitting on this part of the plane.</EmptyState>}
        {data && !empty && (
          <div aria-busy={isLoading} className={isLoading ? 'opacity-60' : undefined}>
            <DensityFigure map={data} horizontal={drawnHorizontal} />
          </div>
        )}
      </div>
    </Panel>
  );
}
