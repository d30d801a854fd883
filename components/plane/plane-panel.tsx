'use client';

import { useState } from 'react';
import useSWR from 'swr';
import type { ApiError } from '@/lib/api/client';
import type { PlaneView } from '@/lib/samples/shapes';
import { EmptyState } from '../empty-state';
import { LoadingBlock } from '../loading-block';
import { Notice } from '../notice';
import { Panel } from '../panel';
import { formatCount } from '../samples/numbers';
import { DensityFigure } from './density-figure';
import { PlaneControls } from './plane-controls';
import { DEFAULT_BIN_SIZE, planeUrl, type PlaneChoice } from './plane-view-settings';

/** A first look at a sample's primary emission plane, with the coordinate and bin size to choose. */
export function PlanePanel({ sampleId, collision = 'hadron' }: { sampleId: number; collision?: 'hadron' | 'ee' }) {
  const [choice, setChoice] = useState<PlaneChoice>({ horizontal: 'lnInvDelta', binSize: DEFAULT_BIN_SIZE });
  // While another choice loads, the map drawn last stays on screen (it names its own horizontal coordinate).
  const { data, error, isLoading } = useSWR<PlaneView, ApiError>(planeUrl(sampleId, choice), { keepPreviousData: true });
  const empty = data && !data.density.some((value) => value > 0);
  return (
    <Panel title="Primary plane" aside={data && `${formatCount(data.jetCount)} jets`}>
      <div className="space-y-3">
        <PlaneControls choice={choice} onChange={setChoice} collision={collision} />
        {error && <Notice tone="error">{error.message}</Notice>}
        {!data && !error && <LoadingBlock label="Drawing the plane…" />}
        {empty && <EmptyState title="No splittings in this range">The kept jets have no primary splitting on this part of the plane.</EmptyState>}
        {data && !empty && (
          <div aria-busy={isLoading} className={isLoading ? 'opacity-60' : undefined}>
            <DensityFigure map={data} collision={collision} />
          </div>
        )}
      </div>
    </Panel>
  );
}
