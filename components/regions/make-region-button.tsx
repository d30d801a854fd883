'use client';

// "Make this a region": one click opens the new-region form for a shape that already exists (a Separation's
// proposed region), so it is saved with a title, category and first comment like any drawn one.
import { useMemo, useState } from 'react';
import useSWR from 'swr';
import type { ApiError } from '@/lib/api/client';
import type { RegionGeometry } from '@/lib/physics/plane/region';
import type { StudyDetail } from '../api-types';
import { Button } from '../button';
import { NewRegionForm } from './new-region-form';
import { regionsUrl, type RegionsList } from './use-regions-workspace';

interface MakeRegionButtonProps {
  studyId: number;
  entryId: number | null;
  geometry: RegionGeometry;
  /** The shape in words (describeShape of shape-text.ts, with the view's axis labels). */
  shapeText: string;
  defaultTitle?: string;
  label?: string;
  onCreated?: (regionId: number) => void;
}

export function MakeRegionButton({ studyId, entryId, geometry, shapeText, defaultTitle, label = 'Make this a region', onCreated }: MakeRegionButtonProps) {
  const [open, setOpen] = useState(false);
  const { data: list } = useSWR<RegionsList, ApiError>(open ? regionsUrl(studyId) : null);
  const { data: study } = useSWR<StudyDetail, ApiError>(open ? `/api/studies/${studyId}` : null);
  const members = useMemo(() => (study?.members ?? []).map((m) => ({ userId: m.userId, name: m.name })), [study]);
  if (!open) {
    return (
      <Button size="sm" onClick={() => setOpen(true)}>
        {label}
      </Button>
    );
  }
  return (
    <NewRegionForm
      studyId={studyId}
      entryId={entryId}
      geometry={geometry}
      shapeText={shapeText}
      categories={list?.categories ?? []}
      members={members}
      defaultTitle={defaultTitle}
      onCancel={() => setOpen(false)}
      onCreated={(region) => {
        setOpen(false);
        onCreated?.(region.id);
      }}
    />
  );
}
