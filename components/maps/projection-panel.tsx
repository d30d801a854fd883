'use client';

import * as Plot from '@observablehq/plot';
import { useEffect, useRef, useState } from 'react';
import useSWR from 'swr';
import type { ApiError } from '@/lib/api/client';
import { axisLabel } from '@/lib/maps/axis-labels';
import type { DisplaySettings } from '@/lib/maps/entry-settings';
import type { ProjectionResult } from '@/lib/maps/shapes';
import type { PlaneView } from '@/lib/maps/view-settings';
import type { AxisChoice, PlaneAxes } from '@/lib/physics/plane/axes';
import { binEdges } from '@/lib/physics/plane/bins';
import { expectedProjection } from '@/lib/physics/plane/expectation';
import { inlineSelectClass } from '../fields';
import { LoadingBlock } from '../loading-block';
import { Notice } from '../notice';
import { useBoxWidth } from '../plane/use-box-width';
import { formatValue } from '../plane/value-format';
import { ChoiceButtons } from './choice-buttons';
import { ExportMenu } from './export-menu';
import { projectionApiUrl } from './view-urls';

export type ProjectionSettings = NonNullable<DisplaySettings['projection']>;

/** Series colours: ink, then the ends of the house sequential scheme and the accent. */
const SERIES = ['#1d2733', '#cc6b4f', '#0f766e', '#953143', '#4a5868', '#e9b079'];

interface ProjectionPanelProps {
  sampleIds: number[];
  view: PlaneView;
  projection: ProjectionSettings;
  overlays: DisplaySettings['overlays'];
  onChange: (projection: ProjectionSettings | null) => void;
  title: string;
}

interface Point {
  series: string;
  x1: number;
  x2: number;
  x: number;
  value: number | null;
  error: number | null;
}

/** One or more samples' densities projected onto one coordinate in a slice of the other, their ratio, the expectation. */
export function ProjectionPanel({ sampleIds, view, projection, overlays, onChange, title }: ProjectionPanelProps) {
  const { data, error, isLoading } = useSWR<ProjectionResult, ApiError>(projectionApiUrl(sampleIds, view, projection), { keepPreviousData: true });
  const { box, width } = useBoxWidth();
  const holder = useRef<HTMLDivElement>(null);
  const figureRef = useRef<Element | null>(null);
  const [from, setFrom] = useState(projection.from === null ? '' : String(projection.from));
  const [to, setTo] = useState(projection.to === null ? '' : String(projection.to));
  const onto = (projection.onto === 'x' ? view.x : view.y) as AxisChoice;
  const other = (projection.onto === 'x' ? view.y : view.x) as AxisChoice;

  useEffect(() => {
    if (!data || !holder.current || width === 0) return;
    const points: Point[] = [];
    const names = data.series.map((s) => s.sample.name);
    data.series.forEach((series) => {
      series.density.forEach((value, i) => {
        points.push({ series: series.sample.name, x1: data.edges[i], x2: data.edges[i + 1], x: (data.edges[i] + data.edges[i + 1]) / 2, value, error: series.error[i] });
      });
    });
    const marks: Plot.Markish[] = [
      Plot.ruleX(points, { x: 'x', y1: (d: Point) => (d.value ?? 0) - (d.error ?? 0), y2: (d: Point) => (d.value ?? 0) + (d.error ?? 0), stroke: 'series' }),
      Plot.dot(points, { x: 'x', y: 'value', fill: 'series', r: 2.5, tip: true, title: (d: Point) => `${d.series}\n${formatValue(d.x1)} to ${formatValue(d.x2)}: ${formatValue(d.value)} ± ${formatValue(d.error, 2)}` }),
    ];
    if (overlays.expectation !== 'none') {
      const first = data.series[0];
      const otherEdges = Array.from(binEdges(projection.onto === 'x' ? data.bins.y : data.bins.x));
      if (first.medianPt !== null) {
        const curve = expectedProjection({ x: view.x, y: view.y } as PlaneAxes, projection.onto, data.edges, otherEdges, data.slice.from, data.slice.to, {
          parton: overlays.parton,
          terms: overlays.expectation,
          pt: first.medianPt,
          R: first.sample.R,
        });
        const line = Array.from(curve, (value, i) => ({ x1: data.edges[i], x2: data.edges[i + 1], value: Number.isFinite(value) ? value : null }));
        marks.push(Plot.rectY(line.filter((d) => d.value !== null), { x1: 'x1', x2: 'x2', y: 'value', fill: 'none', stroke: '#0b5953', strokeDasharray: '5 3', ariaDescription: 'expectation' }));
      }
    }
    const main = Plot.plot({
      width,
      height: 240,
      marginLeft: 52,
      style: { fontSize: '11px', background: 'transparent' },
      x: { label: axisLabel(onto), labelAnchor: 'center', labelArrow: 'none' },
      y: { label: `splittings per jet per unit ${axisLabel(onto)}`, labelArrow: 'none', grid: true },
      color: { domain: names, range: SERIES, legend: true },
      marks,
    });
    const charts: Element[] = [main];
    if (data.ratios.length > 0) {
      const ratioPoints = data.ratios.flatMap((ratio) => {
        const name = data.series.find((s) => s.sample.id === ratio.sample)?.sample.name ?? String(ratio.sample);
        return ratio.value.map((value, i) => ({ series: name, x: (data.edges[i] + data.edges[i + 1]) / 2, value, error: ratio.error[i] }));
      });
      charts.push(
        Plot.plot({
          width,
          height: 140,
          marginLeft: 52,
          style: { fontSize: '11px', background: 'transparent' },
          x: { label: axisLabel(onto), labelAnchor: 'center', labelArrow: 'none' },
          y: { label: `ratio to ${names[0]}`, labelArrow: 'none', grid: true },
          color: { domain: names, range: SERIES },
          marks: [
            Plot.ruleY([1], { stroke: '#8795a6' }),
            Plot.ruleX(ratioPoints.filter((d) => d.value !== null), { x: 'x', y1: (d) => d.value! - (d.error ?? 0), y2: (d) => d.value! + (d.error ?? 0), stroke: 'series' }),
            Plot.dot(ratioPoints.filter((d) => d.value !== null), { x: 'x', y: 'value', fill: 'series', r: 2.5 }),
          ],
        }),
      );
    }
    const wrapper = document.createElement('div');
    wrapper.append(...charts);
    holder.current.replaceChildren(wrapper);
    figureRef.current = wrapper;
    return () => wrapper.remove();
  }, [data, width, overlays, view, projection.onto, onto]);

  const applySlice = () => {
    const number = (v: string) => (v.trim() === '' || !Number.isFinite(Number(v)) ? null : Number(v));
    onChange({ ...projection, from: number(from), to: number(to) });
  };

  return (
    <section aria-label="Projection" className="space-y-2 rounded-md border border-ink/10 p-3">
      <div className="flex flex-wrap items-center gap-3 text-sm">
        <h3 className="font-semibold">Projection</h3>
        <ChoiceButtons label="Project onto" value={projection.onto} options={[['y', `onto ${axisLabel(view.y as AxisChoice)}`], ['x', `onto ${axisLabel(view.x as AxisChoice)}`]]} onChange={(next) => onChange({ onto: next, from: null, to: null })} />
        <label className="flex items-center gap-1.5 text-ink-soft">
          {axisLabel(other)} from
          <input aria-label="Slice from" className={`${inlineSelectClass} w-20`} value={from} placeholder="min" onChange={(event) => setFrom(event.target.value)} onBlur={applySlice} onKeyDown={(event) => event.key === 'Enter' && applySlice()} />
        </label>
        <label className="flex items-center gap-1.5 text-ink-soft">
          to
          <input aria-label="Slice to" className={`${inlineSelectClass} w-20`} value={to} placeholder="max" onChange={(event) => setTo(event.target.value)} onBlur={applySlice} onKeyDown={(event) => event.key === 'Enter' && applySlice()} />
        </label>
        <button type="button" className="text-xs text-ink-soft underline" onClick={() => onChange(null)}>
          Close projection
        </button>
      </div>
      {error && <Notice tone="error">{error.message}</Notice>}
      {!data && !error && <LoadingBlock label="Projecting…" />}
      {data && (
        <p className="text-xs text-ink-soft">
          Summed over {axisLabel(other)} from {formatValue(data.slice.from)} to {formatValue(data.slice.to)} (whole bins).
          {overlays.expectation !== 'none' && ' Dashed: the leading-order expectation over the same slice, at the first sample’s median pₜ.'}
        </p>
      )}
      <div ref={box} aria-busy={isLoading} className={isLoading ? 'opacity-60' : undefined}>
        <div ref={holder} />
      </div>
      {data && <ExportMenu url={(format) => projectionApiUrl(sampleIds, view, projection, format)} figure={() => figureRef.current} title={title} baseName={`projection-${sampleIds.join('-')}`} />}
    </section>
  );
}
