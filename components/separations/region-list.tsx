'use client';

import type { RegionProposal } from '@/lib/physics/separation/region-finder';
import type { RegionAxes, RegionShape } from '@/lib/physics/plane/region';
import type { SavedRegion } from '@/lib/separations/settings';
import { Button } from '../button';
import { MakeRegionButton } from '../regions/make-region-button';
import { describeShape } from '../regions/shape-text';
import { formatValue, formatWithError } from '../plane/value-format';

interface RegionListProps {
  proposals: RegionProposal[];
  measure: string;
  axes: RegionAxes;
  xLabel: string;
  yLabel: string;
  saved: SavedRegion[];
  /** Editors save a proposal with the entry; null for readers. */
  onSave: ((region: SavedRegion) => void) | null;
  /** Where a proposal becomes a Region with a discussion thread (commenters and above); null: not offered. */
  regionsOf: { studyId: number; entryId: number | null } | null;
}

const range = (a: number, b: number) => `${formatValue(a)} to ${formatValue(b)}`;

/** The ranked region proposals with their figures, and the regions saved with the entry. */
export function RegionList({ proposals, measure, axes, xLabel, yLabel, saved, onSave, regionsOf }: RegionListProps) {
  const shapeOf = (p: RegionProposal): RegionShape => ({ type: 'rectangle', ...p.rectangle });
  const isSaved = (p: RegionProposal) =>
    saved.some(({ geometry: { shape } }) => shape.type === 'rectangle' && shape.x1 === p.rectangle.x1 && shape.x2 === p.rectangle.x2 && shape.y1 === p.rectangle.y1 && shape.y2 === p.rectangle.y2);
  return (
    <div className="space-y-3">
      <p className="text-xs text-ink-faint">
        Bins ranked by their {measure}; from the best bin not yet used, a rectangle grows a row or a column at a time while the significance of S − B inside it rises. Densities are per jet, from the training halves.
      </p>
      {proposals.length === 0 && <p className="text-sm text-ink-soft">No bin has enough entries in both samples to propose a region.</p>}
      <ol className="space-y-2">
        {proposals.map((p) => (
          <li key={p.rank} className="rounded-md border border-ink/10 px-3 py-2 text-sm" data-testid={`region-${p.rank}`}>
            <div className="flex flex-wrap items-baseline justify-between gap-2">
              <span className="font-semibold">
                #{p.rank}: {xLabel} {range(p.rectangle.x1, p.rectangle.x2)}, {yLabel} {range(p.rectangle.y1, p.rectangle.y2)}
              </span>
              {onSave && (
                <Button size="sm" disabled={isSaved(p)} onClick={() => onSave({ title: `Region proposal #${p.rank}`, rank: p.rank, geometry: { axes, shape: shapeOf(p) } })}>
                  {isSaved(p) ? 'Saved' : 'Save with the entry'}
                </Button>
              )}
            </div>
            {regionsOf && (
              <div className="mt-1">
                <MakeRegionButton
                  studyId={regionsOf.studyId}
                  entryId={regionsOf.entryId}
                  geometry={{ axes, shape: shapeOf(p) }}
                  shapeText={describeShape(shapeOf(p), xLabel, yLabel)}
                  defaultTitle={`Separating region #${p.rank}`}
                  label="Make this a region to discuss"
                />
              </div>
            )}
            <p className="text-ink-soft">
              signal {formatWithError(p.signalPerJet, p.signalError)} and background {formatWithError(p.backgroundPerJet, p.backgroundError)} emissions per jet (densities {formatValue(p.signalDensity)} and{' '}
              {formatValue(p.backgroundDensity)} per unit area); S/B = {formatWithError(p.ratio, p.ratioError)}; significance of S − B: {formatValue(p.significance)} σ ({p.significance < 0 ? 'background-like' : 'signal-like'}).
            </p>
          </li>
        ))}
      </ol>
      {saved.length > 0 && (
        <div>
          <h3 className="text-sm font-semibold">Saved with the entry</h3>
          <ul className="list-disc pl-5 text-sm text-ink-soft" data-testid="saved-regions">
            {saved.map((s, k) => (
              <li key={k}>
                {s.title}: {describeShape(s.geometry.shape, xLabel, yLabel)}
              </li>
            ))}
          </ul>
        </div>
      )}
    </div>
  );
}
