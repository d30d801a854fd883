import { buttonClass } from '../button';
import { Panel } from '../panel';

/** Keys whose plain spelling reads badly when split at capitals. */
const KEY_NAMES: Record<string, string> = { sha256: 'SHA-256', R: 'R', R0: 'R0', yMax: '|y| max', ptMin: 'pt min' };

/** "fileName" → "file name". */
function keyName(key: string): string {
  return KEY_NAMES[key] ?? key.replace(/([a-z0-9])([A-Z])/g, '$1 $2').replace(/_/g, ' ').toLowerCase();
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

function PlainValue({ value }: { value: unknown }) {
  if (value === null || value === undefined || value === '') return <span className="text-ink-faint">–</span>;
  if (typeof value === 'string' || typeof value === 'number' || typeof value === 'boolean') {
    return <span className="break-all font-mono text-xs">{String(value)}</span>;
  }
  return <code className="break-all font-mono text-xs">{JSON.stringify(value)}</code>;
}

/** Nested facts as nested lists, so the header metadata and the settings keep their grouping. */
function FactList({ facts, depth = 0 }: { facts: Record<string, unknown>; depth?: number }) {
  return (
    <dl className={`grid grid-cols-[minmax(6rem,auto)_minmax(0,1fr)] gap-x-4 gap-y-1.5 text-sm ${depth > 0 ? 'mt-1 border-l border-ink/10 pl-3' : ''}`}>
      {Object.entries(facts).map(([key, value]) =>
        isRecord(value) && depth < 2 ? (
          <div key={key} className="col-span-2">
            <dt className="text-ink-soft">{keyName(key)}</dt>
            <dd>
              <FactList facts={value} depth={depth + 1} />
            </dd>
          </div>
        ) : (
          <div key={key} className="contents">
            <dt className="text-ink-soft">{keyName(key)}</dt>
            <dd className="min-w-0">
              <PlainValue value={value} />
            </dd>
          </div>
        ),
      )}
    </dl>
  );
}

/** Where the sample came from and how it was made, as the server recorded it, with the JSON download. */
export function ProvenancePanel({ sampleId, provenance }: { sampleId: number; provenance: Record<string, unknown> | null }) {
  return (
    <Panel title="Provenance" lead="The file, its header, the settings and the software that made this sample.">
      <div className="space-y-4">
        {provenance ? <FactList facts={provenance} /> : <p className="text-sm text-ink-soft">Recorded once processing has finished.</p>}
        <a href={`/api/samples/${sampleId}/provenance`} download className={buttonClass('secondary', 'sm')}>
          Download provenance (JSON)
        </a>
      </div>
    </Panel>
  );
}
