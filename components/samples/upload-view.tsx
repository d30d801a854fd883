'use client';

import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useRef, useState, type FormEvent } from 'react';
import { messageOf } from '@/lib/api/client';
import { Button, buttonClass } from '../button';
import { EmptyState } from '../empty-state';
import { LoadingBlock } from '../loading-block';
import { Notice } from '../notice';
import { PageHeader } from '../page-header';
import { Panel } from '../panel';
import { DuplicateNotice } from './duplicate-notice';
import { describeFile, type SampleDescription } from './file-header';
import { FileDrop } from './file-drop';
import { readSettings } from './processing-settings';
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

/** The upload page: a file, what to call it, the study it belongs to and how to process it. */
export function UploadView({ studyId }: { studyId?: string }) {
  const router = useRouter();
  const { editable, error: studiesError } = useStudies();
  const [file, setFile] = useState<File | null>(null);
  const [description, setDescription] = useState(EMPTY_DESCRIPTION);
  const [phase, setPhase] = useState<Phase>({ kind: 'editing' });
  const [problems, setProblems] = useState<string[]>([]);
  const [cancelled, setCancelled] = useState(false);
  const chosenFile = useRef<File | null>(null);

  async function chooseFile(next: File) {
    chosenFile.current = next;
    setFile(next);
    const described = await describeFile(next);
    // A slow read of an earlier choice must not overwrite the fields of a later one.
    if (chosenFile.current === next) setDescription(described);
  }

  async function send(body: FormData) {
    setProblems([]);
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
      else setProblems([messageOf(caught)]);
    }
  }

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const data = new FormData(event.currentTarget);
    const { settings, problems: settingProblems } = readSettings(data);
    const missing = [!file && 'Choose a file to upload.', !data.get('studyId') && 'Choose the study the sample belongs to.'];
    const found = [...missing.filter((text): text is string => !!text), ...(settingProblems ?? [])];
    if (!file || !settings || found.length > 0) return setProblems(found);
    const body = new FormData();
    for (const name of ['studyId', 'name', 'label', 'description', 'tags']) body.append(name, String(data.get(name) ?? '').trim());
    body.append('settings', JSON.stringify(settings));
    body.append('file', file); // last, so the server knows the study and settings before the bytes arrive
    void send(body);
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
        onChange={() => problems.length > 0 && setProblems([])}
        aria-label="Upload a sample"
        className="space-y-6"
        noValidate
      >
        <Panel title="File and description">
          <div className="space-y-4">
            <FileDrop file={file} onFile={chooseFile} disabled={busy} />
            <SampleFields
              studies={editable}
              studyId={studyId}
              description={description}
              onDescription={setDescription}
              disabled={busy}
            />
          </div>
        </Panel>
        <Panel title="How to process it">
          <SettingsFields disabled={busy} />
        </Panel>
        {problems.length > 0 && (
          <Notice tone="error">
            {problems.length === 1 ? problems[0] : <ul className="list-disc pl-4">{problems.map((text) => <li key={text}>{text}</li>)}</ul>}
          </Notice>
        )}
        {cancelled && <Notice>{UPLOAD_CANCELLED} Nothing was stored.</Notice>}
        {phase.kind === 'sending' && file && <TransferProgress file={file} fraction={phase.fraction} onCancel={phase.cancel} />}
        {phase.kind === 'duplicate' && (
          <DuplicateNotice
            existing={phase.existing}
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
