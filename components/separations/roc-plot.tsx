'use client';

import * as Plot from '@observablehq/plot';
import { useCallback } from 'react';
import type { RocView } from '@/lib/separations/shapes';
import { PlotHolder } from './plot-holder';

/** Series colours: the plane score first and strongest, then the single-variable taggers. */
export const SERIES_COLOURS = ['#b4462d', '#1f5f99', '#6a7f2a', '#7a4e9c', '#0f766e', '#9a6b16', '#5c6673'];

export interface RocSeries {
  name: string;
  roc: RocView;
}

/** ROC curves as signal efficiency against background rejection 1/ε_B, on a log or linear rejection axis. */
export function RocPlot({ series, axis }: { series: RocSeries[]; axis: 'linear' | 'log' }) {
  const draw = useCallback(
    (width: number) => {
      const points = series.flatMap((s) =>
        s.roc.curve.filter((p) => p.backgroundEfficiency > 0 && p.signalEfficiency > 0).map((p) => ({ series: s.name, x: p.signalEfficiency, y: 1 / p.backgroundEfficiency })),
      );
      // On a linear axis the rejection near ε_S = 0 dwarfs the rest: show it from ε_S = 0.1 up.
      const linearTop = Math.max(2, ...points.filter((p) => p.x >= 0.1).map((p) => p.y)) * 1.05;
      return Plot.plot({
        width,
        height: Math.round(Math.min(420, width * 0.62)),
        marginLeft: 56,
        style: { fontSize: '11px', background: 'transparent' },
        x: { label: 'signal efficiency ε_S', domain: [0, 1], grid: true, labelAnchor: 'center', labelArrow: 'none' },
        y: axis === 'log' ? { type: 'log', label: 'background rejection 1/ε_B', grid: true, labelArrow: 'none' } : { label: 'background rejection 1/ε_B', domain: [1, linearTop], grid: true, labelArrow: 'none' },
        color: { domain: series.map((s) => s.name), range: SERIES_COLOURS, legend: true },
        marks: [
          Plot.line(points, { x: 'x', y: 'y', stroke: 'series', strokeWidth: (d: { series: string }) => (d.series === series[0]?.name ? 2.4 : 1.3), clip: true }),
          Plot.ruleX([0.3, 0.5, 0.7], { stroke: '#8795a6', strokeDasharray: '3 3' }),
        ],
      });
    },
    [series, axis],
  );
  return <PlotHolder draw={draw} label="ROC curves: signal efficiency against background rejection" />;
}
