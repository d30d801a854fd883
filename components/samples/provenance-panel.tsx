import type { ReactNode } from 'react';
import type { SampleProvenance } from '@/lib/samples/shapes';
import type { CompleteSampleSettings } from '@/models/sample-fields';
import { buttonClass } from '../button';
import { formatDateTime } from '../format';
import { Panel } from '../panel';
import { Typeset } from '../typeset';
import { formatBytes } from './numbers';
import { constituentsText, exclusiveText } from './jet-definition-text';
import { ALGORITHM_NAMES, EE_ALGORITHM_NAMES } from './processing-settings';

type Fact = [label: string, value: ReactNode];

/** Labelled facts under a small heading; empty values show as a dash. */
function FactGroup({ title, facts }: { title: string; facts: Fact[] }) {
  return (
    <div>
      <h3 className="mb-1.5 text-xs font-medium uppercase tracking-wider text-ink-soft">{title}</h3>
      <dl className="grid grid-cols-[minmax(7rem,auto)_minmax(0,1fr)] gap-x-4 gap-y-1 text-sm">
        {facts.map(([label, value]) => (
          <div key={label} className="contents">
            <dt className="text-ink-soft">{label}</dt>
            <dd className="min-w-0 break-words text-ink">{value === null || value === undefined || value === '' ? '–' : value}</dd>
          </div>
        ))}
      </dl>
    </div>
  );
}

/** A free-form header value: text as it is, an object as one line a field, anything deeper as JSON. */
function MetadataValue({ value, nested = false }: { value: unknown; nested?: boolean }) {
  if (typeof value === 'string') return <>{value}</>;
  if (!nested && value && typeof value === 'object' && !Array.isArray(value)) {
    return (
      <ul>
        {Object.entries(value).map(([key, inner]) => (
          <li key={key}>
            <span className="text-ink-soft">{key}:</span> <MetadataValue value={inner} nested />
          </li>
        ))}
      </ul>
    );
  }
  return <code className="break-all font-mono text-xs">{JSON.stringify(value)}</code>;
}

function metadataFacts(metadata: Record<string, unknown>): Fact[] {
  return Object.entries(metadata).map(([key, value]) => [key, <MetadataValue key={key} value={value} />]);
}

function settingsFacts(settings: CompleteSampleSettings, tree: SampleProvenance['tree']): Fact[] {
  const { jet, softDrop, ee } = settings;
  const jets: Fact[] =
    settings.collision === 'ee'
      ? [
          ['Collision', 'e+e− (energy and angles; declustered in θ with kₜ = E sin θ, re-clustered with e+e− Cambridge)'],
          ['Jets', `${EE_ALGORITHM_NAMES[ee.algorithm]}${ee.algorithm === 'genkt' ? `, R = ${jet.R}, p = ${ee.p}` : ''}, ${exclusiveText(jet.exclusive)}`],
          ['Cuts', `E > ${ee.eMin} GeV, ${jet.maxJets === null ? 'all jets' : `${jet.maxJets} leading jets`} per record`],
        ]
      : [
          ['Jets', `${ALGORITHM_NAMES[jet.algorithm]}, R = ${jet.R}${jet.exclusive ? `, ${exclusiveText(jet.exclusive)}` : ''}`],
          ['Cuts', <Typeset key="cuts" text={`p_T > ${jet.ptMin} GeV, |y| < ${jet.yMax}, ${jet.maxJets === null ? 'all jets' : `${jet.maxJets} leading jets`} per record`} />],
        ];
  return [
    ...jets,
    ['Constituents', constituentsText(settings.particles)],
    ['Flavour tags', settings.flavourTags ? 'b, c, light by ghost association' : 'off'],
    ['SoftDrop', <Typeset key="softdrop" text={`z_cut = ${softDrop.zCut}, β = ${softDrop.beta}, R_0 = ${softDrop.R0}`} />],
    ['Multiplicity', <Typeset key="multiplicity" text={`primary splittings with k_t > ${settings.multiplicityKtCut} GeV`} />],
    ['Stored', tree === 'full' ? 'every splitting of the C/A tree' : 'primary splittings'],
  ];
}

const seconds = (value: number | null) => (value === null ? '–' : `${value.toFixed(1)} s`);

/**
 * How much of the processing went on while the file was still arriving (the server had room and started early);
 * said from a tenth of a second on, the precision of the times beside it.
 */
function overlapNote(timings: SampleProvenance['timings']): string {
  const overlap = timings.startedAt ? (Date.parse(timings.uploadedAt) - Date.parse(timings.startedAt)) / 1000 : 0;
  return overlap >= 0.05 ? `, ${seconds(overlap)} of it while the file was arriving` : '';
}

/** Where the sample came from and how it was made, as the server recorded it, with the JSON download. */
export function ProvenancePanel({ provenance }: { provenance: SampleProvenance }) {
  const { file, input, timings } = provenance;
  return (
    <Panel title="Provenance" lead="The file, what its header said, the settings and the software that made this sample.">
      <div className="space-y-5">
        <FactGroup
          title="File"
          facts={[
            ['Name', <span key="name" className="break-all">{file.name}</span>],
            ['Size', formatBytes(file.size)],
            ['SHA-256', <code key="sha" className="break-all font-mono text-xs">{file.sha256}</code>],
            ['Format', input && `${input.format} ${input.version}${input.gzip ? ', gzip' : ''} (${input.layout})`],
            ['Content', input && `${input.content}; momentum ${input.momentum} in ${input.energyUnit}`],
          ]}
        />
        {input && Object.keys(input.metadata).length > 0 && <FactGroup title="Header metadata" facts={metadataFacts(input.metadata)} />}
        <FactGroup title="Settings" facts={settingsFacts(provenance.settings, provenance.tree)} />
        <FactGroup
          title="Made by"
          facts={[
            ['Software', `${provenance.software.name} ${provenance.software.version ?? ''}`.trim()],
            ['Uploaded by', provenance.uploadedBy?.name ?? 'a removed account'],
            ['Uploaded', `${formatDateTime(timings.uploadedAt)}, sent in ${seconds(timings.uploadSeconds)}`],
            ['Processed', timings.finishedAt && `${formatDateTime(timings.finishedAt)}, in ${seconds(timings.processingSeconds)}${overlapNote(timings)}`],
          ]}
        />
        <a href={`/api/samples/${provenance.sample.id}/provenance`} download className={buttonClass('secondary', 'sm')}>
          Download provenance (JSON)
        </a>
      </div>
    </Panel>
  );
}
