import { Panel } from '../panel';
import { formatCount } from './numbers';
import type { SampleCounts } from './sample-types';
import { StatGrid } from './stat-grid';

/** What processing found: records, jets kept and dropped (by the first cut each failed), splittings. */
export function SampleCountsPanel({ counts }: { counts: SampleCounts }) {
  const { rejected } = counts;
  const dropped = rejected.pt + rejected.y + rejected.rank;
  return (
    <Panel title="Counts">
      <StatGrid
        label="Counts"
        stats={[
          { label: 'Records', value: formatCount(counts.records) },
          { label: 'Jets kept', value: formatCount(counts.jets) },
          {
            label: 'Jets rejected',
            value: formatCount(dropped),
            note: `pt ${formatCount(rejected.pt)} · |y| ${formatCount(rejected.y)} · leading-N ${formatCount(rejected.rank)}`,
          },
          { label: 'Primary splittings', value: formatCount(counts.splittings) },
        ]}
      />
    </Panel>
  );
}
