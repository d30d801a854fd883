// What the server benchmarks share: memory of the server's process tree from /proc, waiting for jobs, and
// uploading a file with curl and an API token as a script would.
import { spawn } from 'node:child_process';
import { readFileSync, readdirSync } from 'node:fs';
import type { TestServer } from '../tests/support/server';

/** CPU time of a process so far (all its threads), from /proc, in ms. */
export function cpuMs(pid: number): number {
  const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
  return ((Number(fields[11]) + Number(fields[12])) * 1000) / 100;
}

/** Resident memory of a process and all its descendants, in kB, from /proc. */
export function treeKb(pid: number): number {
  const children = new Map<number, number[]>();
  for (const name of readdirSync('/proc')) {
    if (!/^\d+$/.test(name)) continue;
    try {
      const parent = Number(/^PPid:\s+(\d+)/m.exec(readFileSync(`/proc/${name}/status`, 'utf8'))?.[1]);
      children.set(parent, [...(children.get(parent) ?? []), Number(name)]);
    } catch {
      // Gone meanwhile.
    }
  }
  let total = 0;
  for (const stack = [pid]; stack.length > 0; ) {
    const current = stack.pop()!;
    try {
      total += Number(/^VmRSS:\s+(\d+)/m.exec(readFileSync(`/proc/${current}/status`, 'utf8'))?.[1] ?? 0);
    } catch {
      continue;
    }
    stack.push(...(children.get(current) ?? []));
  }
  return total;
}

export function peakKb(pid: number): number {
  return Number(/^VmHWM:\s+(\d+)/m.exec(readFileSync(`/proc/${pid}/status`, 'utf8'))?.[1] ?? 0);
}

/**
 * Waits until sample `id`'s job has ended and returns the sample: each request waits on the server (`?wait=`), which
 * answers as soon as the job ends, as a script would (README, "Scripting with an API token").
 */
export async function waitForSampleEnd(server: TestServer, token: string, id: number): Promise<any> {
  for (;;) {
    const response = await fetch(`${server.baseUrl}/api/samples/${id}?wait=60`, { headers: { authorization: `Bearer ${token}` } });
    if (response.status !== 200) throw new Error(`sample ${id} answered ${response.status}: ${await response.text()}`);
    const { sample } = await response.json();
    if (!['queued', 'running'].includes(sample.state)) return sample;
  }
}

/** Polls the list of samples every 0.1 s until `until` holds (the demo samples' jobs at a first start). */
export async function waitForJobs(server: TestServer, token: string, until: (samples: any[]) => boolean): Promise<any[]> {
  for (;;) {
    const response = await fetch(`${server.baseUrl}/api/samples`, { headers: { authorization: `Bearer ${token}` } });
    const { samples } = await response.json();
    if (until(samples)) return samples;
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

/**
 * Uploads as a script would, with curl (as in the README): Node's own fetch spends more CPU building the multipart
 * body than the server spends receiving it, and the two share the machine's cores.
 */
export async function curlUpload(
  server: TestServer,
  token: string,
  file: string,
  fields: { studyId: number; name: string; settings?: string; force?: boolean },
): Promise<any> {
  const curl = spawn('curl', [
    '--silent',
    '--show-error',
    '--header',
    `Authorization: Bearer ${token}`,
    '--form',
    `studyId=${fields.studyId}`,
    '--form',
    `name=${fields.name}`,
    ...(fields.settings ? ['--form', `settings=${fields.settings}`] : []),
    ...(fields.force ? ['--form', 'force=1'] : []),
    '--form',
    `file=@${file}`,
    '--write-out',
    '\\n%{http_code}',
    `${server.baseUrl}/api/samples/upload`,
  ]);
  let output = '';
  curl.stdout.on('data', (chunk) => (output += chunk));
  curl.stderr.on('data', (chunk) => (output += chunk));
  const code = await new Promise<number | null>((resolve, reject) => {
    curl.on('error', (error) => reject(new Error(`cannot run curl (is it installed?): ${error.message}`)));
    curl.on('close', resolve);
  });
  const [body, status] = [output.slice(0, output.lastIndexOf('\n')), output.slice(output.lastIndexOf('\n') + 1)];
  if (code !== 0 || status !== '202') throw new Error(`the upload failed (curl ${code}, HTTP ${status}): ${body}`);
  return JSON.parse(body);
}

