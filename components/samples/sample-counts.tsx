import type { SampleCounts } from '@/models/sample-fields';
import { Panel } from '../panel';
import { Typeset } from '../typeset';
import { formatCount } from './numbers';
import { StatGrid } from './stat-grid';

/** What processing found: records, jets kept and dropped (by the first cut each failed), splittings. */
export function SampleCountsPanel({ counts }: { counts: SampleCounts }) {
  const { jetsRejected: rejected } = counts;
  return (
    <Panel title="Counts">
      <StatGrid
        label="Counts"
        stats={[
          { label: 'Records', value: formatCount(counts.records), note: `${formatCount(counts.particles)} particles` },
          { label: 'Jets kept', value: formatCount(counts.jets) },
          {
            label: 'Jets rejected',
            value: formatCount(rejected.pt + rejected.y + rejected.rank),
            note: <Typeset text={`p_T ${formatCount(rejected.pt)} · |y| ${formatCount(rejected.y)} · leading-N ${formatCount(rejected.rank)}`} />,
          },
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
