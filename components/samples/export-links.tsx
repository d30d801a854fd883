import { buttonClass } from '../button';
import { Panel } from '../panel';

/** Downloads of the sample's declusterings in the splitfield-declusterings format. */
export function ExportLinks({ sampleId, fullTree }: { sampleId: number; fullTree: boolean }) {
  const url = (all: boolean) => `/api/samples/${sampleId}/export?all=${all ? 1 : 0}`;
  return (
    <Panel title="Export" lead="JSON Lines, one line a jet: its kinematics and primary splittings.">
      <div className="space-y-2">
        <div className="flex flex-wrap gap-2">
          <a href={url(false)} download className={buttonClass('secondary', 'sm')}>
            Declusterings (JSON Lines)
          </a>
          {fullTree && (
            <a href={url(true)} download className={buttonClass('secondary', 'sm')}>
              With the full tree
            </a>
          )}
        </div>
        {!fullTree && (
          <p className="text-xs text-ink-soft">
            The full-tree export needs a sample processed with “Keep every splitting of the Cambridge/Aachen tree”.
          </p>
        )}
      </div>
    </Panel>
  );
}
