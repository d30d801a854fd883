'use client';

import { useCallback, useMemo, useRef } from 'react';
import useSWR from 'swr';
import type { ApiError } from '@/lib/api/client';
import { axisLabel, densityLabel } from '@/lib/maps/axis-labels';
import type { ContrastSettings } from '@/lib/maps/entry-settings';
import type { ContrastResult } from '@/lib/maps/shapes';
import type { AxisChoice } from '@/lib/physics/plane/axes';
import { Button } from '../button';
import { inlineSelectClass } from '../fields';
import { axesOfView } from '@/lib/regions/geometry-schema';
import { LoadingBlock } from '../loading-block';
import { Notice } from '../notice';
import { divergingDomain, sequentialDomain } from '../plane/colour-scale';
import { PlaneFigure } from '../plane/plane-figure';
import { RegionsPanel } from '../regions/regions-panel';
import { useRegionsWorkspace } from '../regions/use-regions-workspace';
import { formatValue } from '../plane/value-format';
import { BoxResult } from './box-result';
import { ChoiceButtons } from './choice-buttons';
import { ExportMenu } from './export-menu';
import { filterRefusal } from './map-view';
import { MinEntriesField } from './min-entries-field';
import { OutsideNote } from './outside-note';
import { ProjectionPanel } from './projection-panel';
import { ViewControls } from './view-controls';
import { contrastApiUrl } from './view-urls';

const MODE_NAMES = { ratio: 'ratio B/A', difference: 'difference B − A', pull: 'pull (B − A)/σ' } as const;

interface ContrastViewProps {
  settings: ContrastSettings;
  onChange?: (next: ContrastSettings) => void;
  compact?: boolean;
  /** The study entry shown: its study's regions of this plane are drawn, listed and discussed (not when compact). */
  regionsOf?: { studyId: number; entryId: number | null };
}

/** A Contrast: two or more samples on the same bins, each later one compared with the first. */
export function ContrastView({ settings, onChange, compact = false, regionsOf }: ContrastViewProps) {
  const { data, error, isLoading } = useSWR<ContrastResult, ApiError>(contrastApiUrl(settings), { keepPreviousData: true });
  const figure = useRef<Element | null>(null);
  const keepFigure = useCallback((element: Element | null) => {
    figure.current = element;
  }, []);
  const change = (next: Partial<ContrastSettings>) => onChange?.({ ...settings, ...next });
  const serverFilterError = filterRefusal(error);

  const drawn = useMemo(() => {
    if (!data) return null;
    const x = data.view.x as AxisChoice;
    const y = data.view.y as AxisChoice;
    const type = settings.display.colour;
    const pivot = data.mode === 'ratio' ? 1 : 0;
    const collision = data.inputs[0].sample.collision;
    return {
      xLabel: axisLabel(x, collision),
      yLabel: axisLabel(y, collision),
      inputsColour: {
        scheme: 'ember' as const,
        type,
        domain: sequentialDomain(data.inputs.map((i) => i.plane.density), type),
        label: densityLabel(x, y, false, collision),
      },
      comparisons: data.comparisons.map((c) => ({
        comparison: c,
        colour: {
          scheme: 'tide' as const,
          type: data.mode === 'ratio' ? type : ('linear' as const),
          pivot,
          domain: divergingDomain(c.value, pivot, data.mode === 'ratio' ? type : 'linear'),
          label: MODE_NAMES[data.mode],
        },
        grid: { xEdges: data.inputs[0].plane.xEdges, yEdges: data.inputs[0].plane.yEdges, values: c.value, errors: c.error, masked: c.masked },
      })),
    };
  }, [data, settings.display.colour]);
  const place = regionsOf && !compact ? { ...regionsOf, axes: axesOfView(data?.view ?? settings.view) } : null;
  const regions = useRegionsWorkspace(place);
  const planes = useMemo(() => data?.inputs ?? [], [data]);
  // While a region is being drawn, the pointer draws it instead of the box.
  const figureRegions = regions?.figure ?? {};
  const box = useMemo(() => settings.box, [JSON.stringify(settings.box)]); // eslint-disable-line react-hooks/exhaustive-deps

  const names = data?.inputs.map((input) => input.sample.name) ?? [];
  const title = names.length > 0 ? `${MODE_NAMES[settings.mode]}: ${names.slice(1).join(', ')} over ${names[0]}` : '';

  return (
    <div className="space-y-3">
      {!compact && onChange && (
        <>
          <ViewControls
            view={settings.view}
            display={settings.display}
            onView={(view) => change({ view })}
            onDisplay={(display) => change({ display })}
            serverFilterError={serverFilterError}
            withOverlays={false}
            collision={data?.inputs[0]?.sample.collision}
          />
          <div className="flex flex-wrap items-center gap-3 text-sm">
            <ChoiceButtons label="Comparison" value={settings.mode} options={[['ratio', 'Ratio'], ['difference', 'Difference'], ['pull', 'Pull']]} onChange={(mode) => change({ mode })} />
            <MinEntriesField value={settings.minEntries} onChange={(minEntries) => change({ minEntries })} />
          </div>
        </>
      )}
      {error && !serverFilterError && <Notice tone="error">{error.message}</Notice>}
      {!data && !error && <LoadingBlock label="Comparing…" />}
      {data && drawn && (
        <div aria-busy={isLoading} className={`space-y-3 ${isLoading ? 'opacity-60' : ''}`}>
          {drawn.comparisons.map(({ comparison, colour, grid }) => {
            const b = data.inputs.find((input) => input.sample.id === comparison.sample)!;
            return (
              <div key={comparison.sample} className="space-y-1">
                <PlaneFigure
                  grid={grid}
                  colour={colour}
                  xLabel={drawn.xLabel}
                  yLabel={drawn.yLabel}
                  valueName={data.mode === 'ratio' ? `${b.sample.label || 'B'}/${data.inputs[0].sample.label || 'A'}` : data.mode === 'pull' ? 'pull' : 'ρB − ρA'}
                  compact={compact}
                  box={box}
                  onBox={onChange && !compact ? (box) => change({ box }) : undefined}
                  title={`${b.sample.name} vs ${data.inputs[0].sample.name}`}
                  figureRef={keepFigure}
                  {...figureRegions}
                />
                <p data-testid="chi2" className="text-xs text-ink-soft">
                  χ²/ndf = {formatValue(comparison.chi2)}/{comparison.ndf} = {formatValue(comparison.chi2 / comparison.ndf)} over the bins with at least {data.minEntries} splittings in both (grey: masked).
                </p>
              </div>
            );
          })}
          <div className={`grid gap-3 ${compact ? 'grid-cols-2' : 'sm:grid-cols-2'}`}>
            {data.inputs.map((input, k) => (
              <div key={input.sample.id}>
                <PlaneFigure
                  grid={{ xEdges: input.plane.xEdges, yEdges: input.plane.yEdges, values: input.plane.density, errors: input.plane.error, counts: input.plane.count }}
                  colour={drawn.inputsColour}
                  xLabel={drawn.xLabel}
                  yLabel={drawn.yLabel}
                  valueName="ρ"
                  compact
                  legend={k === 0}
                  title={`${String.fromCharCode(65 + k)}: ${input.sample.name}`}
                  regions={regions?.figure.regions}
                />
                {!compact && <OutsideNote outside={input.outside} splittingsPerJet={input.splittingsPerJet} />}
              </div>
            ))}
          </div>
          {!compact && <p className="text-xs text-ink-faint">The inputs share one colour scale.</p>}
        </div>
      )}
      {data && !compact && (
        <>
          {regions && drawn && <RegionsPanel workspace={regions} planes={planes} xLabel={drawn.xLabel} yLabel={drawn.yLabel} />}
          <BoxResult
            box={settings.box}
            onBox={(box) => change({ box })}
            a={data.inputs[0]}
            b={data.inputs[1]}
            xLabel={drawn!.xLabel}
            yLabel={drawn!.yLabel}
          />
          <ExportMenu url={(format) => contrastApiUrl(settings, format)} figure={() => figure.current} title={title} baseName={`contrast-${settings.sampleIds.join('-')}`} />
          {settings.display.projection ? (
            <ProjectionPanel
              sampleIds={settings.sampleIds}
              view={data.view}
              projection={settings.display.projection}
              overlays={settings.display.overlays}
              onChange={(projection) => change({ display: { ...settings.display, projection } })}
              title={`${title}, projection`}
            />
          ) : (
            onChange && (
              <Button size="sm" onClick={() => change({ display: { ...settings.display, projection: { onto: 'y', from: null, to: null } } })}>
                Show a projection
              </Button>
            )
          )}
        </>
      )}
    </div>
  );
}
