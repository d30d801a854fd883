'use client';

// Saving a new region: the same call for a shape drawn on a figure, typed in, or proposed by a Separation.
import { useState } from 'react';
import { useSWRConfig } from 'swr';
import { messageOf, sendJson } from '@/lib/api/client';
import type { RegionGeometry } from '@/lib/physics/plane/region';
import type { RegionView } from '@/lib/regions/shapes';
import { regionsUrl } from './use-regions-workspace';

export interface NewRegionInput {
  title: string;
  categoryId?: number | null;
  /** The first comment (Markdown). */
  comment: string;
  entryId?: number | null;
  geometry: RegionGeometry;
}

/** `create` posts the region and refreshes every view of the study's regions; `error` is the server's message. */
export function useCreateRegion(studyId: number) {
  const { mutate } = useSWRConfig();
  const [pending, setPending] = useState(false);
  const [error, setError] = useState<string | null>(null);
  async function create(input: NewRegionInput): Promise<RegionView | null> {
    setPending(true);
    setError(null);
    try {
      const { region } = await sendJson<{ region: RegionView }>('POST', regionsUrl(studyId), input);
      await mutate(regionsUrl(studyId));
      return region;
    } catch (failure) {
      setError(messageOf(failure));
      return null;
    } finally {
      setPending(false);
    }
  }
  return { create, pending, error };
}
