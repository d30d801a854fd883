// Where a region is shown: on the view it was drawn on (opened at its thread), else in its study's list.

export function regionLink(region: { id: number; studyId: number; entryId: number | null }): string {
  return region.entryId === null
    ? `/studies/${region.studyId}?region=${region.id}#regions`
    : `/studies/${region.studyId}/entries/${region.entryId}?region=${region.id}`;
}
