'use client';

// The regions of one plane of a study, as a view shows them: those drawn on the same axes, which one is selected,
// the shape being drawn or typed (not yet saved), and the props a PlaneFigure takes to draw and show them.
// Any view that shows a plane (Map, Contrast, Separation) mounts this with its axes and passes `figure` to its
// PlaneFigure and the workspace to a RegionsPanel.
import { useCallback, useEffect, useMemo, useState } from 'react';
import useSWR from 'swr';
import type { ApiError } from '@/lib/api/client';
import type { RegionAxes, RegionShape } from '@/lib/physics/plane/region';
import { axesKey } from '@/lib/regions/geometry-schema';
import type { RegionCategoryView, RegionView } from '@/lib/regions/shapes';
import type { DrawMode } from '../plane/figure-drawing';
import type { FigureRegion } from '../plane/region-marks';

/** Outline colour of a region without a category. */
export const UNCATEGORISED_COLOUR = '#4a5868';

export interface RegionsWorkspace {
  studyId: number;
  /** The entry new regions are drawn on (their link); null when drawn elsewhere. */
  entryId: number | null;
  axes: RegionAxes;
  /** The study's regions on these axes, and how many it has on other planes. */
  regions: RegionView[];
  elsewhere: number;
  categories: RegionCategoryView[];
  error: ApiError | undefined;
  selectedId: number | null;
  select: (id: number | null) => void;
  drawMode: DrawMode | null;
  setDrawMode: (mode: DrawMode | null) => void;
  /** A shape drawn or typed and not yet saved as a region. */
  pending: RegionShape | null;
  setPending: (shape: RegionShape | null) => void;
  refresh: () => Promise<unknown>;
  /** Spread into a PlaneFigure: the regions to draw, and drawing when a mode is chosen. */
  figure: { regions: FigureRegion[]; draw: DrawMode | null; onShape: (shape: RegionShape) => void };
}

export interface RegionsList {
  regions: RegionView[];
  categories: RegionCategoryView[];
}

export const regionsUrl = (studyId: number) => `/api/studies/${studyId}/regions`;

/** The region named by the page address (`?region=12`), once, so a link from a notification opens its thread. */
function regionInAddress(): number | null {
  if (typeof window === 'undefined') return null;
  const value = new URLSearchParams(window.location.search).get('region');
  return value && /^[1-9]\d{0,14}$/.test(value) ? Number(value) : null;
}

export interface WorkspacePlace {
  studyId: number;
  entryId: number | null;
  axes: RegionAxes;
}

/** The workspace of a view's plane; null (and nothing fetched) when `place` is null, e.g. a view outside a study. */
export function useRegionsWorkspace(place: WorkspacePlace | null): RegionsWorkspace | null {
  // Regions others draw appear within a few seconds; their threads poll faster while open (region-thread.tsx).
  const { data, error, mutate } = useSWR<RegionsList, ApiError>(place ? regionsUrl(place.studyId) : null, { refreshInterval: 10_000 });
  const [selectedId, setSelectedId] = useState<number | null>(null);
  const [drawMode, setDrawMode] = useState<DrawMode | null>(null);
  const [pending, setPending] = useState<RegionShape | null>(null);
  useEffect(() => setSelectedId(regionInAddress()), []);

  const key = place ? axesKey(place.axes) : '';
  const all = useMemo(() => data?.regions ?? [], [data]);
  const regions = useMemo(() => all.filter((region) => axesKey(region.geometry.axes) === key), [all, key]);
  const figureRegions = useMemo(
    () =>
      regions.map((region) => ({
        id: region.id,
        title: region.title,
        shape: region.geometry.shape,
        colour: region.category?.colour ?? UNCATEGORISED_COLOUR,
        resolved: region.state === 'resolved',
        selected: region.id === selectedId,
      })),
    [regions, selectedId],
  );
  const onShape = useCallback((shape: RegionShape) => {
    setPending(shape);
    setDrawMode(null);
  }, []);

  if (!place) return null;
  return {
    ...place,
    regions,
    elsewhere: all.length - regions.length,
    categories: data?.categories ?? [],
    error,
    selectedId,
    select: setSelectedId,
    drawMode,
    setDrawMode,
    pending,
    setPending,
    refresh: mutate,
    figure: { regions: figureRegions, draw: drawMode, onShape },
  };
}
