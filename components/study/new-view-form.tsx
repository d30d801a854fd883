'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import useSWR from 'swr';
import { sendJson, type ApiError } from '@/lib/api/client';
import type { SampleSummary } from '@/lib/samples/shapes';
import { ActionForm, field, SubmitOrCancel } from '../action-form';
import type { Entry } from '../api-types';
import { TextField } from '../fields';
import { LoadingBlock } from '../loading-block';
import { Notice } from '../notice';
import { entryPageUrl } from '../maps/view-urls';

const FORM_NAMES = { map: 'Add a map', contrast: 'Add a contrast', separation: 'Add a separation' } as const;
const SUBMIT = { map: 'Add map', contrast: 'Add contrast', separation: 'Add separation' } as const;
const LEGENDS = { map: 'Sample', contrast: 'Samples (the first you tick is the reference A)', separation: 'Samples (the first you tick is the signal, the second the background)' } as const;

/**
 * Adds a Map (one sample), a Contrast (two or more, the first is the reference) or a Separation (two: signal, then
 * background) and opens it.
 */
export function NewViewForm({ studyId, kind, onCancel }: { studyId: string; kind: 'map' | 'contrast' | 'separation'; onCancel: () => void }) {
  const router = useRouter();
  const { data, error } = useSWR<{ samples: SampleSummary[] }, ApiError>(`/api/samples?studyId=${encodeURIComponent(studyId)}&state=done`);
  const [chosen, setChosen] = useState<number[]>([]);
  const samples = data?.samples ?? [];
  const most = kind === 'map' ? 1 : kind === 'separation' ? 2 : Infinity;
  const toggle = (id: number) =>
    setChosen((list) => (kind === 'map' ? [id] : list.includes(id) ? list.filter((x) => x !== id) : list.length < most ? [...list, id] : list));

  async function create(form: FormData) {
    const settings = kind === 'map' ? { sampleId: chosen[0] } : kind === 'contrast' ? { sampleIds: chosen } : { signalSampleId: chosen[0], backgroundSampleId: chosen[1] };
    const { entry } = await sendJson<{ entry: Entry }>('POST', `/api/studies/${studyId}/entries`, { kind, title: field(form, 'title'), settings });
    router.push(entryPageUrl(studyId, entry.id));
  }

  const needed = kind === 'map' ? 1 : 2;
  return (
    <ActionForm aria-label={FORM_NAMES[kind]} onSubmit={create} className="space-y-3 rounded-lg border border-accent/40 bg-paper-raised p-4 shadow-sm">
      <TextField label="Title" name="title" placeholder="Optional" />
      <fieldset className="space-y-1.5">
        <legend className="text-sm font-medium">{LEGENDS[kind]}</legend>
        {error && <Notice tone="error">{error.message}</Notice>}
        {!data && !error && <LoadingBlock label="Loading samples…" />}
        {data && samples.length === 0 && <p className="text-sm text-ink-soft">No processed samples in this study yet.</p>}
        {samples.map((sample) => (
          <label key={sample.id} className="flex items-center gap-2 text-sm">
            <input type={kind === 'map' ? 'radio' : 'checkbox'} name="sample" checked={chosen.includes(sample.id)} onChange={() => toggle(sample.id)} />
            {sample.name}
            {kind === 'contrast' && chosen.includes(sample.id) && <span className="text-xs text-ink-faint">({String.fromCharCode(65 + chosen.indexOf(sample.id))})</span>}
            {kind === 'separation' && chosen.includes(sample.id) && <span className="text-xs text-ink-faint">({chosen.indexOf(sample.id) === 0 ? 'signal' : 'background'})</span>}
          </label>
        ))}
      </fieldset>
      <SubmitOrCancel label={chosen.length >= needed ? SUBMIT[kind] : `Choose ${needed === 1 ? 'a sample' : kind === 'separation' ? 'two samples' : 'two or more samples'}`} onCancel={onCancel} />
    </ActionForm>
  );
}
