import type { CompleteSampleSettings, SampleCounts } from '@/models/sample-fields';
import { exclusiveText } from './jet-definition-text';
import { Panel } from '../panel';
import { Typeset } from '../typeset';
import { formatCount } from './numbers';
import { StatGrid } from './stat-grid';

const RULE_NAMES: Record<keyof NonNullable<SampleCounts['particlesRemoved']>, string> = {
  neutrino: 'neutrinos',
  pidExcluded: 'pid excluded',
  pidNotIncluded: 'pid not listed',
  neutral: 'neutral',
  pt: 'p_T',
  rapidity: '|y| or |η|',
};

/**
 * What processing found: records, particles removed by the constituent selection (by the first rule each failed),
 * jets kept and dropped (by the first cut each failed; e+e-: the energy cut), jet flavours, splittings.
 */
export function SampleCountsPanel({ counts, collision = 'hadron', exclusive = null }: { counts: SampleCounts; collision?: 'hadron' | 'ee'; exclusive?: CompleteSampleSettings['jet']['exclusive'] }) {
  const { jetsRejected: rejected, particlesRemoved: removed, flavours } = counts;
  const removedTotal = removed ? Object.values(removed).reduce((a, b) => a + b, 0) : 0;
  const extra = [
    ...(removed
      ? [{
          label: 'Particles removed',
          value: formatCount(removedTotal),
          note: (Object.keys(RULE_NAMES) as (keyof typeof RULE_NAMES)[]).filter((k) => removed[k] > 0).map((k) => `${RULE_NAMES[k]} ${formatCount(removed[k])}`).join(' · ') || 'none',
        }]
      : []),
    ...(flavours ? [{ label: 'Jet flavours', value: `${formatCount(flavours.b)} b`, note: `c ${formatCount(flavours.c)} · light ${formatCount(flavours.light)}` }] : []),
  ];
  const rejectedNote =
    collision === 'ee'
      ? `energy ${formatCount(rejected.pt)} · leading-N ${formatCount(rejected.rank)}`
      : `p_T ${formatCount(rejected.pt)} · |y| ${formatCount(rejected.y)} · leading-N ${formatCount(rejected.rank)}`;
  return (
    <Panel title="Counts">
      <StatGrid
        label="Counts"
        stats={[
          { label: 'Records', value: formatCount(counts.records), note: `${formatCount(counts.particles)} particles` },
          { label: 'Jets kept', value: formatCount(counts.jets), note: exclusive ? exclusiveText(exclusive) : 'inclusive jets' },
          {
            label: 'Jets rejected',
            value: formatCount(rejected.pt + rejected.y + rejected.rank),
            note: <Typeset text={rejectedNote} />,
          },
          ...extra,
          {
            label: 'Primary splittings',
            value: formatCount(counts.primarySplittings),
            note: counts.allSplittings > 0 ? `${formatCount(counts.allSplittings)} in the full trees` : undefined,
          },
        ]}
      />
    </Panel>
  );
}
