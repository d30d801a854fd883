import { buttonClass } from '../button';
import { Panel } from '../panel';

/** Downloads of the sample's declusterings in the splitfield-declusterings format. */
export function ExportLinks({ sampleId }: { sampleId: number }) {
  const url = (all: boolean) => `/api/samples/${sampleId}/export?all=${all ? 1 : 0}`;
  return (
    <Panel title="Export" lead="One line a jet (JSON Lines): kinematics and its primary splittings.">
      <div className="flex flex-wrap gap-2">
        <a href={url(false)} download className={buttonClass('secondary', 'sm')}>
          Declusterings (JSON Lines)
        </a>
        <a href={url(true)} download className={buttonClass('secondary', 'sm')}>
          With the full tree
        </a>
      </div>
    </Panel>
  );
}
