'use client';

import { useMemo } from 'react';
import useSWR from 'swr';
import type { ApiError } from '@/lib/api/client';
import { axisLabel } from '@/lib/maps/axis-labels';
import type { AxisChoice } from '@/lib/physics/plane/axes';
import type { SavedRegion, SeparationSettings } from '@/lib/separations/settings';
import type { SeparationResult } from '@/lib/separations/shapes';
import type { ContrastResult } from '@/lib/maps/shapes';
import { axesOfView } from '@/lib/regions/geometry-schema';
import { LoadingBlock } from '../loading-block';
import { ChoiceButtons } from '../maps/choice-buttons';
import { filterRefusal } from '../maps/map-view';
import { MinEntriesField } from '../maps/min-entries-field';
import { ViewControls } from '../maps/view-controls';
import { Notice } from '../notice';
import { divergingDomain } from '../plane/colour-scale';
import { PlaneFigure } from '../plane/plane-figure';
import type { FigureRegion } from '../plane/region-marks';
import { RegionsPanel } from '../regions/regions-panel';
import { useRegionsWorkspace } from '../regions/use-regions-workspace';
import { contrastApiUrl } from '../maps/view-urls';
import { formatValue, formatWithError } from '../plane/value-format';
import { FiguresTable } from './figures-table';
import { RegionList } from './region-list';
import { type RocSeries, RocPlot, SERIES_COLOURS } from './roc-plot';
import { ScorePlot } from './score-plot';
import { separationApiUrl } from './separation-urls';

const PAIR_COLOURS = [SERIES_COLOURS[0], SERIES_COLOURS[1]];

interface SeparationViewProps {
  settings: SeparationSettings;
  onChange?: (next: SeparationSettings) => void;
  /** Saves a region proposal with the entry at once (editors); null for readers. */
  onSaveRegion?: ((region: SavedRegion) => void) | null;
  /** The study entry shown: its study's regions of this plane are drawn, listed and discussed (not when compact). */
  regionsOf?: { studyId: number; entryId: number | null };
  /** The reader may turn a proposal into a Region with a discussion thread (commenters and above). */
  mayMakeRegions?: boolean;
  /** The study's list: the map, the AUC line and nothing else. */
  compact?: boolean;
}

/** Proposals drawn like Regions, in ink, titled by rank, under the study's own regions. */
const PROPOSAL_INK = '#1d2733';

function Section({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <section className="space-y-2" aria-label={title}>
      <h2 className="text-base font-semibold">{title}</h2>
      {children}
    </section>
  );
}

/** A Separation: the ln-ratio map with region proposals, the ROC of the plane score and of single variables, scores. */
export function SeparationView({ settings, onChange, onSaveRegion = null, regionsOf, mayMakeRegions = false, compact = false }: SeparationViewProps) {
  const { data, error, isLoading } = useSWR<SeparationResult, ApiError>(separationApiUrl(settings), { keepPreviousData: true });
  const place = regionsOf && !compact ? { ...regionsOf, axes: axesOfView(data?.view ?? settings.view) } : null;
  const regions = useRegionsWorkspace(place);
  // A region's live numbers are densities of the whole samples on the view's bins: the contrast of background and
  // signal gives both planes (the first is the reference, so the ratio is S/B).
  const pair = { sampleIds: [settings.backgroundSampleId, settings.signalSampleId], view: settings.view, mode: 'ratio' as const, minEntries: settings.minEntries };
  const { data: planesOfPair } = useSWR<ContrastResult, ApiError>(place ? contrastApiUrl(pair) : null, { keepPreviousData: true });
  const planes = useMemo(() => planesOfPair?.inputs ?? [], [planesOfPair]);
  const change = (next: Partial<SeparationSettings>) => onChange?.({ ...settings, ...next });
  const serverFilterError = filterRefusal(error);

  const drawn = useMemo(() => {
    if (!data) return null;
    const collision = data.signal.sample.collision;
    const { x, y } = data.bins;
    const xEdges = Array.from({ length: x.count + 1 }, (_, k) => (k === x.count ? x.max : Number((x.min + k * x.step).toPrecision(12))));
    const yEdges = Array.from({ length: y.count + 1 }, (_, k) => (k === y.count ? y.max : Number((y.min + k * y.step).toPrecision(12))));
    const series: RocSeries[] = [{ name: 'plane score (Poisson emissions)', roc: data.score.roc }, ...data.variables.map((v) => ({ name: `${v.label} (${v.largerIsSignal ? 'larger' : 'smaller'} is signal-like)`, roc: v.roc }))];
    return {
      xLabel: axisLabel(data.view.x as AxisChoice, collision),
      yLabel: axisLabel(data.view.y as AxisChoice, collision),
      grid: { xEdges, yEdges, values: data.logRatio.value, errors: data.logRatio.error, masked: data.logRatio.masked },
      colour: { scheme: 'tide' as const, type: 'linear' as const, pivot: 0, domain: divergingDomain(data.logRatio.value, 0, 'linear'), label: 'ln(ρ_S/ρ_B)' },
      proposals: data.regions.proposals.map(
        (p): FigureRegion => ({ id: -p.rank, title: `#${p.rank}`, shape: { type: 'rectangle', ...p.rectangle }, colour: PROPOSAL_INK, resolved: false, selected: false }),
      ),
      series,
      thresholds: data.score.roc.workingPoints.map((w) => w.threshold),
      names: [data.signal.sample.name, data.background.sample.name],
    };
  }, [data]);

  // Kept stable between renders: a new array would make the figure redraw itself each time.
  const studyRegions = regions?.figure.regions;
  const figureRegions = useMemo(() => [...(drawn?.proposals ?? []), ...(studyRegions ?? [])], [drawn, studyRegions]);

  const title = data ? `ln(ρ_S/ρ_B): ${data.signal.sample.name} (signal) over ${data.background.sample.name} (background)` : '';
  return (
    <div className="space-y-4">
      {!compact && onChange && (
        <>
          <ViewControls view={settings.view} onView={(view) => change({ view })} serverFilterError={serverFilterError} withOverlays={false} collision={data?.signal.sample.collision} />
          <div className="text-sm">
            <MinEntriesField value={settings.minEntries} onChange={(minEntries) => change({ minEntries })} suffix="in either training half" />
          </div>
        </>
      )}
      {error && !serverFilterError && <Notice tone="error">{error.message}</Notice>}
      {!data && !error && <LoadingBlock label="Separating…" />}
      {data && drawn && (
        <div aria-busy={isLoading} className={`space-y-5 ${isLoading ? 'opacity-60' : ''}`}>
          <p className="text-sm" data-testid="split-rule">
            <span className="font-medium">Train/evaluate split.</span> {data.splitRule} Signal: {data.signal.trainJets} training and {data.signal.evaluateJets} evaluation jets; background: {data.background.trainJets} and{' '}
            {data.background.evaluateJets}.
          </p>
          <div className={compact ? '' : 'grid gap-5 lg:grid-cols-2'}>
            <div className="space-y-1">
              <PlaneFigure
                grid={drawn.grid}
                colour={drawn.colour}
                xLabel={drawn.xLabel}
                yLabel={drawn.yLabel}
                valueName="ln(ρ_S/ρ_B)"
                compact={compact}
                title={title}
                {...regions?.figure}
                regions={figureRegions}
              />
              <p className="text-xs text-ink-soft">
                Grey: fewer than {data.minEntries} splittings in either training half (left out of the score). Red: signal-like, blue: background-like. Dark outlines: region proposals by rank; coloured: the study’s regions.
              </p>
            </div>
            {!compact && (
              <Section title="ROC">
                <ChoiceButtons label="Rejection axis" value={settings.display.rocAxis} options={[['log', 'Log axis'], ['linear', 'Linear axis']]} onChange={(rocAxis) => change({ display: { ...settings.display, rocAxis } })} />
                <RocPlot series={drawn.series} axis={settings.display.rocAxis} />
              </Section>
            )}
          </div>
          {compact ? (
            <p className="text-sm" data-testid="compact-auc">
              Plane score AUC {formatWithError(data.score.roc.auc, data.score.roc.aucError)}; rejection at 50 % signal efficiency{' '}
              {formatValue(data.score.roc.workingPoints[1]?.rejection ?? null)}.
            </p>
          ) : (
            <>
              <Section title="AUC and background rejection">
                <FiguresTable series={drawn.series} />
              </Section>
              <Section title="Score distributions (evaluation jets)">
                <ScorePlot distribution={data.score.distribution} names={drawn.names} colours={PAIR_COLOURS} thresholds={drawn.thresholds} />
                <p className="text-xs text-ink-faint">
                  Score of a jet: Σ ln(ρ_S/ρ_B) over its {data.view.tree === 'primary' ? 'primary ' : ''}splittings in unmasked bins − ∫(ρ_S − ρ_B) = {formatValue(-data.logRatio.excessPerJet)} (Poisson emission
                  model). Dashed: the thresholds of 30, 50 and 70 % signal efficiency.
                </p>
              </Section>
              <Section title="Region proposals">
                <RegionList
                  proposals={data.regions.proposals}
                  measure={data.regions.measure}
                  axes={axesOfView(data.view)}
                  xLabel={drawn.xLabel}
                  yLabel={drawn.yLabel}
                  saved={settings.savedRegions}
                  onSave={onSaveRegion}
                  regionsOf={mayMakeRegions && regionsOf ? regionsOf : null}
                />
              </Section>
              {regions && <RegionsPanel workspace={regions} planes={planes} xLabel={drawn.xLabel} yLabel={drawn.yLabel} />}
            </>
          )}
        </div>
      )}
    </div>
  );
}
