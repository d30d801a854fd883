'use client';

// Every region of a study on its page: title, state, category and comments, each linked to the view it was drawn
// on, where its numbers and thread are.
import Link from 'next/link';
import useSWR from 'swr';
import type { ApiError } from '@/lib/api/client';
import { regionLink } from '@/lib/regions/links';
import { countOf } from '../format';
import { Panel } from '../panel';
import { regionsUrl, type RegionsList, UNCATEGORISED_COLOUR } from './use-regions-workspace';

export function StudyRegionsList({ studyId }: { studyId: number }) {
  const { data } = useSWR<RegionsList, ApiError>(regionsUrl(studyId));
  if (!data || data.regions.length === 0) return null;
  const open = data.regions.filter((region) => region.state === 'open').length;
  return (
    <div id="regions" className="mt-6">
      <Panel title="Regions" aside={`${open} open of ${data.regions.length}`}>
        <ul className="space-y-1 text-sm">
          {data.regions.map((region) => (
            <li key={region.id} className="flex flex-wrap items-center gap-2">
              <span aria-hidden className="inline-block h-3 w-3 rounded-sm border border-ink/20" style={{ backgroundColor: region.category?.colour ?? UNCATEGORISED_COLOUR }} />
              <Link href={regionLink(region)} className="font-medium text-accent-strong hover:underline">
                {region.title}
              </Link>
              <span className="text-xs text-ink-soft">
                {region.state} · {region.category?.name ?? 'no category'} · {countOf(region.commentCount, 'comment')}
                {region.entryId === null && ' · its view was removed'}
              </span>
            </li>
          ))}
        </ul>
      </Panel>
    </div>
  );
}
