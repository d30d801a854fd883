'use client';

import { useMemo, useState } from 'react';
import useSWR from 'swr';
import { type ApiError, messageOf, sendJson } from '@/lib/api/client';
import type { TaggerApplication } from '@/lib/separations/tagger-apply';
import type { SampleSummary } from '@/lib/samples/shapes';
import { Button, buttonClass } from '../button';
import { inlineSelectClass } from '../fields';
import { Notice } from '../notice';
import { formatValue, formatWithError } from '../plane/value-format';
import { SERIES_COLOURS } from './roc-plot';
import { ScorePlot } from './score-plot';

interface TaggerSummary {
  id: number;
  name: string;
  sourceEntryId: number | null;
  training: { signal: { name: string }; background: { name: string }; auc: number; aucError: number };
  workingPoints: Array<{ signalEfficiency: number; threshold: number; backgroundEfficiency: number }>;
}

const APPLIED_COLOURS = [SERIES_COLOURS[1]];

/** One saved tagger: export, and its application to any sample the reader can see. */
function TaggerItem({ studyId, tagger, samples }: { studyId: string; tagger: TaggerSummary; samples: SampleSummary[] }) {
  const [sampleId, setSampleId] = useState('');
  const { data, error, isLoading } = useSWR<TaggerApplication, ApiError>(sampleId ? `/api/studies/${studyId}/taggers/${tagger.id}/scores?sample=${sampleId}` : null);
  // Stable between renders, so that the chart is drawn once per answer.
  const shown = useMemo(() => data && { names: [data.sample.name], thresholds: data.workingPoints.map((w) => w.threshold) }, [data]);
  return (
    <li className="space-y-2 rounded-md border border-ink/10 px-3 py-2 text-sm" aria-label={`Tagger ${tagger.name}`}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <span>
          <span className="font-semibold">{tagger.name}</span>{' '}
          <span className="text-ink-soft">
            trained on {tagger.training.signal.name} (signal) against {tagger.training.background.name}; AUC {formatWithError(tagger.training.auc, tagger.training.aucError)}
          </span>
        </span>
        <a className={buttonClass('secondary', 'sm')} href={`/api/studies/${studyId}/taggers/${tagger.id}?download=1`} download>
          Export file
        </a>
      </div>
      <label className="flex flex-wrap items-center gap-2 text-ink-soft">
        Apply to
        <select aria-label={`Apply ${tagger.name} to`} className={inlineSelectClass} value={sampleId} onChange={(event) => setSampleId(event.target.value)}>
          <option value="">choose a sample…</option>
          {samples.map((s) => (
            <option key={s.id} value={s.id}>
              {s.name} ({s.studyTitle})
            </option>
          ))}
        </select>
      </label>
      {error && <Notice tone="error">{error.message}</Notice>}
      {isLoading && <p className="text-ink-faint">Scoring…</p>}
      {data && (
        <div className="space-y-2" data-testid="tagger-application">
          <table className="text-sm">
            <thead>
              <tr className="text-left text-xs uppercase tracking-wide text-ink-faint">
                <th className="pr-4 font-medium">working point (ε_S on the training pair)</th>
                <th className="pr-4 font-medium">threshold</th>
                <th className="pr-4 font-medium">ε_B on the training pair</th>
                <th className="font-medium">efficiency on {data.sample.name}</th>
              </tr>
            </thead>
            <tbody>
              {data.workingPoints.map((w) => (
                <tr key={w.signalEfficiency}>
                  <td className="pr-4">{Math.round(100 * w.signalEfficiency)} %</td>
                  <td className="pr-4 tabular-nums">{formatValue(w.threshold)}</td>
                  <td className="pr-4 tabular-nums">{formatValue(w.trainingBackgroundEfficiency)}</td>
                  <td className="tabular-nums" data-testid={`applied-efficiency-${Math.round(100 * w.signalEfficiency)}`}>{formatWithError(w.efficiency, w.error)}</td>
                </tr>
              ))}
            </tbody>
          </table>
          <ScorePlot distribution={data.distribution} names={shown!.names} colours={APPLIED_COLOURS} thresholds={shown!.thresholds} />
          <p className="text-xs text-ink-faint">
            {data.jets.selected} jets of {data.sample.name} scored with the tagger’s jet selection; dashed lines: the working points’ thresholds.
          </p>
        </div>
      )}
    </li>
  );
}

/** The study's taggers: save this Separation as one, import a file, and apply any of them to a sample. */
export function TaggerPanel({ studyId, entryId, canEdit }: { studyId: string; entryId: number; canEdit: boolean }) {
  const { data, error, mutate } = useSWR<{ taggers: TaggerSummary[] }, ApiError>(`/api/studies/${studyId}/taggers`);
  const { data: samples } = useSWR<{ samples: SampleSummary[] }, ApiError>('/api/samples?state=done');
  const [name, setName] = useState('');
  const [state, setState] = useState<{ pending: boolean; error: string | null; message: string | null }>({ pending: false, error: null, message: null });

  async function run(work: () => Promise<string>) {
    setState({ pending: true, error: null, message: null });
    try {
      const message = await work();
      await mutate();
      setState({ pending: false, error: null, message });
    } catch (failure) {
      setState({ pending: false, error: messageOf(failure), message: null });
    }
  }
  const save = () =>
    run(async () => {
      await sendJson('POST', `/api/studies/${studyId}/taggers`, { entryId, name: name.trim() });
      setName('');
      return 'Saved as a tagger.';
    });
  const importFile = (file: File) =>
    run(async () => {
      let document: unknown;
      try {
        document = JSON.parse(await file.text());
      } catch {
        throw new Error(`${file.name} is not a JSON file.`);
      }
      await sendJson('POST', `/api/studies/${studyId}/taggers`, { document });
      return `Imported ${file.name}.`;
    });

  return (
    <div className="space-y-3">
      {canEdit && (
        <div className="flex flex-wrap items-center gap-2 text-sm">
          <input aria-label="Tagger name" className={`${inlineSelectClass} w-64`} placeholder="Name of the tagger" value={name} onChange={(event) => setName(event.target.value)} />
          <Button size="sm" variant="primary" disabled={state.pending || name.trim() === ''} onClick={save}>
            Save as a tagger
          </Button>
          <label className={`${buttonClass('ghost', 'sm')} cursor-pointer`}>
            Import a tagger file
            <input type="file" accept="application/json,.json" className="sr-only" onChange={(event) => event.target.files?.[0] && importFile(event.target.files[0])} />
          </label>
        </div>
      )}
      {state.error && <Notice tone="error">{state.error}</Notice>}
      {state.message && <Notice tone="success">{state.message}</Notice>}
      {error && <Notice tone="error">{error.message}</Notice>}
      {data && data.taggers.length === 0 && <p className="text-sm text-ink-soft">No taggers saved in this study yet.</p>}
      <ul className="space-y-2">
        {data?.taggers.map((tagger) => <TaggerItem key={tagger.id} studyId={studyId} tagger={tagger} samples={samples?.samples ?? []} />)}
      </ul>
    </div>
  );
}
