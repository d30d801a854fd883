'use client';

import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useEffect, useRef, useState, type FormEvent } from 'react';
import { ApiError, messageOf, sendJson } from '@/lib/api/client';
import { Button, buttonClass } from '../button';
import { EmptyState } from '../empty-state';
import { LoadingBlock } from '../loading-block';
import { Notice } from '../notice';
import { PageHeader } from '../page-header';
import { Panel } from '../panel';
import { DuplicateNotice } from './duplicate-notice';
import { describeFile, type SampleDescription } from './file-header';
import { FileDrop } from './file-drop';
import { readSettings, settingsFieldName, type FieldProblems } from './processing-settings';
import type { SampleSummary } from '@/lib/samples/shapes';
import { SampleFields } from './sample-fields';
import { SettingsFields } from './settings-fields';
import { TransferProgress } from './transfer-progress';
import { sendUpload, UPLOAD_CANCELLED } from './upload-request';
import { useStudies } from './use-studies';

type Phase =
  | { kind: 'editing' }
  | { kind: 'sending'; fraction: number; cancel: () => void }
  | { kind: 'duplicate'; existing: SampleSummary; body: FormData };

const EMPTY_DESCRIPTION: SampleDescription = { name: '', label: '', description: '', tags: '' };

/** Fields of the form by the names the server uses in its error details. */
const FORM_FIELDS = new Set(['file', 'studyId', 'name', 'label', 'description', 'tags']);

/** What the form shows: problems beside their fields, and those that belong to no field. */
interface Problems {
  fields: FieldProblems;
  general: string[];
}

const NO_PROBLEMS: Problems = { fields: {}, general: [] };

/** The server's refusal as problems beside the fields it names ("settings.jet.R" is the field R). */
function serverProblems(error: unknown): Problems {
  const fields: FieldProblems = {};
  const details = error instanceof ApiError ? error.details : [];
  for (const { path, message } of details) {
    const [head, ...rest] = path.split('.');
    const field = head === 'settings' && rest.length > 0 ? settingsFieldName(rest) : head;
    if (FORM_FIELDS.has(field) || (head === 'settings' && rest.length > 0)) fields[field] ??= message;
  }
  return Object.keys(fields).length > 0 ? { fields, general: [] } : { fields: {}, general: [messageOf(error)] };
}

/** The upload page: a file, what to call it, the study it belongs to and how to process it. */
export function UploadView({ studyId }: { studyId?: string }) {
  const router = useRouter();
  const { editable, error: studiesError } = useStudies();
  const [file, setFile] = useState<File | null>(null);
  const [description, setDescription] = useState(EMPTY_DESCRIPTION);
  const [phase, setPhase] = useState<Phase>({ kind: 'editing' });
  const [problems, setProblems] = useState<Problems>(NO_PROBLEMS);
  const [cancelled, setCancelled] = useState(false);
  const chosenFile = useRef<File | null>(null);
  const form = useRef<HTMLFormElement>(null);

  // The first field with a problem takes the focus, so a keyboard or screen-reader user lands on it.
  useEffect(() => {
    if (Object.keys(problems.fields).length === 0) return;
    form.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus();
  }, [problems]);

  async function chooseFile(next: File) {
    chosenFile.current = next;
    setFile(next);
    const described = await describeFile(next);
    // A slow read of an earlier choice must not overwrite the fields of a later one.
    if (chosenFile.current === next) setDescription(described);
  }

  async function send(body: FormData) {
    setProblems(NO_PROBLEMS);
    setCancelled(false);
    const upload = sendUpload(body, (fraction) => setPhase({ kind: 'sending', fraction, cancel: upload.cancel }));
    setPhase({ kind: 'sending', fraction: 0, cancel: upload.cancel });
    try {
      const answer = await upload.done;
      if ('duplicateOf' in answer) setPhase({ kind: 'duplicate', existing: answer.duplicateOf, body });
      else router.push(`/samples/${answer.sample.id}`);
    } catch (caught) {
      setPhase({ kind: 'editing' });
      if (messageOf(caught) === UPLOAD_CANCELLED) setCancelled(true);
      else setProblems(serverProblems(caught));
    }
  }

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const data = new FormData(event.currentTarget);
    const { settings, problems: settingProblems } = readSettings(data);
    const found: FieldProblems = {};
    if (!file) found.file = 'Choose a file to upload.';
    if (!String(data.get('name') ?? '').trim()) found.name = 'Give the sample a name.';
    if (!data.get('studyId')) found.studyId = 'Choose the study the sample belongs to.';
    Object.assign(found, settingProblems);
    if (!file || !settings || Object.keys(found).length > 0) return setProblems({ fields: found, general: [] });
    const body = new FormData();
    for (const name of ['studyId', 'name', 'label', 'description', 'tags']) body.append(name, String(data.get(name) ?? '').trim());
    body.append('settings', JSON.stringify(settings));
    body.append('file', file); // last, so the server knows the study and settings before the bytes arrive
    void send(body);
  }

  async function attach(existing: SampleSummary, body: FormData) {
    try {
      const answer = await sendJson<{ sample: SampleSummary }>('POST', `/api/samples/${existing.id}/attach`, {
        studyId: Number(body.get('studyId')),
        name: String(body.get('name') ?? '').trim() || undefined,
      });
      router.push(`/samples/${answer.sample.id}`);
    } catch (caught) {
      setPhase({ kind: 'editing' });
      setProblems(serverProblems(caught));
    }
  }

  function processAnyway(body: FormData) {
    body.set('force', '1');
    void send(body);
  }

  if (studiesError) return <Notice tone="error">{studiesError.message}</Notice>;
  if (!editable) return <LoadingBlock label="Loading your studies…" />;
  if (editable.length === 0) {
    return (
      <EmptyState title="No study to upload into" action={<Link href="/studies" className={buttonClass('primary')}>Go to studies</Link>}>
        A sample belongs to a study. Start a study, or ask a study owner to make you an editor.
      </EmptyState>
    );
  }

  const busy = phase.kind !== 'editing';
  return (
    <>
      <PageHeader
        title="Upload a sample"
        lead="Splitfield finds the jets, re-clusters each with Cambridge/Aachen and records every splitting. The sample page follows the processing live."
      />
      <form
        onSubmit={submit}
        ref={form}
        aria-label="Upload a sample"
        className="space-y-6"
        noValidate
      >
        <Panel title="File and description">
          <div className="space-y-4">
            <FileDrop file={file} onFile={chooseFile} disabled={busy} error={problems.fields.file} />
            <SampleFields
              studies={editable}
              studyId={studyId}
              description={description}
              onDescription={setDescription}
              disabled={busy}
              errors={problems.fields}
            />
          </div>
        </Panel>
        <Panel title="How to process it">
          <SettingsFields disabled={busy} errors={problems.fields} />
        </Panel>
        {problems.general.length > 0 && <Notice tone="error">{problems.general.join(' ')}</Notice>}
        {Object.keys(problems.fields).length > 0 && (
          <p role="alert" className="text-sm font-medium text-danger">
            {Object.keys(problems.fields).length === 1 ? 'One field needs attention' : `${Object.keys(problems.fields).length} fields need attention`}: see the messages beside them.
          </p>
        )}
        {cancelled && <Notice>{UPLOAD_CANCELLED} Nothing was stored.</Notice>}
        {phase.kind === 'sending' && file && <TransferProgress file={file} fraction={phase.fraction} onCancel={phase.cancel} />}
        {phase.kind === 'duplicate' && (
          <DuplicateNotice
            existing={phase.existing}
            targetStudyId={Number(phase.body.get('studyId'))}
            onAttach={() => void attach(phase.existing, phase.body)}
            onProcessAnyway={() => processAnyway(phase.body)}
            onDismiss={() => setPhase({ kind: 'editing' })}
          />
        )}
        {phase.kind === 'editing' && (
          <Button type="submit" variant="primary">
            Upload and process
          </Button>
        )}
      </form>
    </>
  );
}
