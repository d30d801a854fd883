'use client';

import * as Plot from '@observablehq/plot';
import { useCallback } from 'react';
import type { ScoreDistribution } from '@/lib/physics/separation/score-distribution';
import { formatValue } from '../plane/value-format';
import { PlotHolder } from './plot-holder';

/** Score distributions as step lines, each normalised to its sample's weight; what lies beyond the range is stated. */
/** `names`, `colours` and `thresholds` should keep their identity between renders: a new array redraws the chart. */
export function ScorePlot({ distribution, names, colours, thresholds }: { distribution: ScoreDistribution; names: string[]; colours: string[]; thresholds: number[] }) {
  const draw = useCallback(
    (width: number) => {
      const { edges, fractions } = distribution;
      const step = edges[1] - edges[0];
      const rows = fractions.flatMap((f, k) => f.map((value, i) => ({ series: names[k], x1: edges[i], x2: edges[i + 1], y: value / step })));
      return Plot.plot({
        width,
        height: 220,
        marginLeft: 56,
        style: { fontSize: '11px', background: 'transparent' },
        x: { label: 'score ln L_S/L_B', labelAnchor: 'center', labelArrow: 'none' },
        y: { label: 'fraction of jets per unit score', grid: true, labelArrow: 'none' },
        color: { domain: names, range: colours, legend: true },
        marks: [
          Plot.rectY(rows, { x1: 'x1', x2: 'x2', y: 'y', fill: 'series', fillOpacity: 0.12, stroke: 'series', strokeWidth: 1.4 }),
          Plot.ruleX(thresholds, { stroke: '#1d2733', strokeDasharray: '4 3' }),
          Plot.ruleY([0]),
        ],
      });
    },
    [distribution, names, colours, thresholds],
  );
  const outside = names.map((name, k) => `${name}: ${formatValue(100 * distribution.below[k], 2)} % below, ${formatValue(100 * distribution.above[k], 2)} % above`).join('; ');
  return (
    <div>
      <PlotHolder draw={draw} label="Score distributions" />
      <p className="text-xs text-ink-faint">Outside the drawn range (its 0.1 % tails): {outside}.</p>
    </div>
  );
}
