'use client';

import * as Plot from '@observablehq/plot';
import { useEffect, useRef } from 'react';
import type { Distribution, JetSummary } from '@/lib/maps/jet-summary';
import type { JetCounts, SampleRef } from '@/lib/maps/shapes';
import { formatCount } from '../samples/numbers';
import { useBoxWidth } from '../plane/use-box-width';
import { formatValue, formatWithError } from '../plane/value-format';

const SCREEN_NAMES: Record<string, string> = { m_g: 'm_g (GeV)', z_g: 'z_g', R_g: 'R_g', multiplicity: 'primary multiplicity' };

function DistributionChart({ distribution }: { distribution: Distribution }) {
  const { box, width } = useBoxWidth();
  const holder = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (!holder.current || width === 0) return;
    const rows = distribution.density.map((value, i) => ({ x1: distribution.edges[i], x2: distribution.edges[i + 1], value, error: distribution.error[i] }));
    const chart = Plot.plot({
      width,
      height: 120,
      marginLeft: 40,
      marginBottom: 30,
      style: { fontSize: '10px', background: 'transparent' },
      x: { label: SCREEN_NAMES[distribution.name] ?? distribution.name, labelAnchor: 'center', labelArrow: 'none' },
      y: { label: '1/N dN/dx', labelArrow: 'none', grid: true },
      marks: [
        Plot.rectY(rows, { x1: 'x1', x2: 'x2', y: 'value', fill: '#cc6b4f', fillOpacity: 0.75, inset: 0.5 }),
        Plot.ruleX(rows, { x: (d) => (d.x1 + d.x2) / 2, y1: (d) => d.value - d.error, y2: (d) => d.value + d.error, stroke: '#1d2733' }),
      ],
    });
    holder.current.replaceChildren(chart);
    return () => chart.remove();
  }, [distribution, width]);
  return (
    <div ref={box}>
      <div ref={holder} aria-label={`Distribution of ${distribution.name}`} role="img" />
    </div>
  );
}

/** The selected jets: how many, which cut the others fell by, the mean multiplicity, and groomed distributions. */
export function JetSummaryPanel({ sample, jets, summary }: { sample: SampleRef; jets: JetCounts; summary: JetSummary }) {
  const r = jets.rejected;
  const fell = [
    r.pt > 0 && `${formatCount(r.pt)} by pₜ`,
    r.absY > 0 && `${formatCount(r.absY)} by |y|`,
    r.leading > 0 && `${formatCount(r.leading)} by leading N`,
    r.filter > 0 && `${formatCount(r.filter)} by the filter`,
  ].filter(Boolean);
  const sd = sample.softDrop;
  return (
    <div className="space-y-3 text-sm">
      <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1">
        <dt className="text-ink-soft">Jets selected</dt>
        <dd data-testid="jets-selected">
          {formatCount(jets.selected)} of {formatCount(jets.stored)}
          {fell.length > 0 ? ` (${fell.join(', ')})` : ''}
        </dd>
        <dt className="text-ink-soft">Median pₜ</dt>
        <dd>{formatValue(jets.medianPt)} GeV</dd>
        <dt className="text-ink-soft">Primary multiplicity</dt>
        <dd>
          {formatWithError(summary.multiplicity.mean, summary.multiplicity.error)} per jet (kₜ &gt; {sample.multiplicityKtCut} GeV)
        </dd>
        <dt className="text-ink-soft">SoftDrop</dt>
        <dd>
          z_cut = {sd.zCut}, β = {sd.beta}, R₀ = {sd.R0}, {sd.mode ?? 'grooming'} mode
        </dd>
      </dl>
      <div className="grid gap-2 sm:grid-cols-2">
        {summary.distributions.map((distribution) => (
          <div key={distribution.name}>
            <DistributionChart distribution={distribution} />
            {distribution.missingWeight > 0 && (
              <p className="text-xs text-ink-soft">{formatValue(distribution.missingWeight / jets.weight)} of the jets have no value (failed the groomer in tagging mode).</p>
            )}
          </div>
        ))}
      </div>
    </div>
  );
}
