// Delivery of notifications by each person's choices (a kind off, one mail each, a daily digest), the job
// runner's sample-finished and sample-failed notifications, and a mail server that is down when a mail is due.
import { SMTPServer } from 'smtp-server';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, freePort, type TestServer } from '../support/server';
import { newPerson, newStudy, serverWithAdmin, type Person } from './fixtures';
import { eventually, onDatabase, outbox, waitForMail } from './mail-fixtures';
import { isFinished, jetsFileText, upload, uploadDone, waitForSample } from './sample-fixtures';

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));
const DIGEST_SECONDS = 8;

describe('notification mails', () => {
  let server: TestServer;
  let admin: Client;

  beforeAll(async () => {
    ({ server, admin } = await serverWithAdmin({ env: { SPLITFIELD_DIGEST_SECONDS: String(DIGEST_SECONDS), SPLITFIELD_MAIL_POLL_SECONDS: '1' } }));
  });
  afterAll(() => server?.stop());

  /** Stands for the producers of mentions and replies: a notification row, as recordNotifications writes it. */
  async function notify(person: Person, kind: string, summary: string): Promise<void> {
    await onDatabase(server, (run) =>
      run(
        "INSERT INTO notifications (user_id, kind, study_id, actor_id, summary, link, mailed_at, created_at, updated_at) VALUES (?, ?, NULL, NULL, ?, '/studies', NULL, datetime('now'), datetime('now'))",
        [person.id, kind, summary],
      ),
    );
  }

  const unmailed = (person: Person) =>
    onDatabase(server, (run) => run('SELECT kind FROM notifications WHERE user_id = ? AND mailed_at IS NULL', [person.id]));

  it('reads and changes the mail choices, refusing unknown kinds and empty changes', async () => {
    const person = await newPerson(server, 'chooser');
    const all = { mention: true, reply: true, 'sample-finished': true, 'sample-failed': true };
    expect((await person.client.get('/api/me/mail')).body).toEqual({ choices: { kinds: all, digest: false } });
    const changed = await person.client.patch('/api/me/mail', { kinds: { reply: false }, digest: true });
    expect(changed.status).toBe(200);
    expect(changed.body.choices).toEqual({ kinds: { ...all, reply: false }, digest: true });
    expect((await person.client.get('/api/me/mail')).body.choices.kinds.reply).toBe(false);
    const unknown = await person.client.patch('/api/me/mail', { kinds: { gossip: true } });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.details[0].path).toBe('kinds');
    expect((await person.client.patch('/api/me/mail', {})).status).toBe(400);
    expect((await person.client.patch('/api/me/mail', { digest: 'daily' })).body.error.details[0].path).toBe('digest');
  });

  it('mails the uploader when a sample finishes or fails, saying why and how to stop', async () => {
    const person = await newPerson(server, 'uploader');
    const study = await newStudy(person.client, 'Mail study');
    const sample = await uploadDone(person.client, { studyId: study, name: 'Quark jets <b>v2</b>', file: jetsFileText(30, 11) });
    const finished = await waitForMail(admin, person.email, /finished processing/);
    expect(finished.subject).toBe('Your sample “Quark jets <b>v2</b>” finished processing: 30 jets.');
    expect(finished.text).toContain(`${server.baseUrl}/samples/${sample.id}`);
    expect(finished.text).toContain('Why you got this mail: you asked for a mail when a sample you uploaded finished processing.');
    expect(finished.text).toContain(`How to stop it: turn off mails about “a sample you uploaded finished processing” (or choose one daily digest) under "Mail" on your profile: ${server.baseUrl}/profile#mail`);
    expect(finished.html).toContain('Quark jets &lt;b&gt;v2&lt;/b&gt;');

    const broken = await upload(person.client, { studyId: study, name: 'Broken file', file: 'this is not a particles file\n' });
    expect(broken.status).toBe(202);
    await waitForSample(person.client, broken.body.sample.id, isFinished);
    const failed = await waitForMail(admin, person.email, /failed/);
    expect(failed.subject).toMatch(/^Your sample “Broken file” failed: line 1/);
  });

  it('sends nothing for a kind turned off, and marks its notifications dealt with', async () => {
    const person = await newPerson(server, 'quiet');
    expect((await person.client.patch('/api/me/mail', { kinds: { mention: false } })).status).toBe(200);
    await notify(person, 'mention', 'Ada mentioned you on region “Soft wide-angle corner”');
    await notify(person, 'reply', 'Ada replied on region “Soft wide-angle corner”');
    await waitForMail(admin, person.email, /replied/);
    await eventually('every notification dealt with', async () => ((await unmailed(person)).length === 0 ? true : undefined));
    expect((await outbox(admin)).queue.filter((mail) => mail.to === person.email).map((mail) => mail.subject)).toEqual([
      'Ada replied on region “Soft wide-angle corner”',
    ]);
  });

  it('gathers notifications into one digest a day for people who chose it', async () => {
    const person = await newPerson(server, 'digest');
    expect((await person.client.patch('/api/me/mail', { digest: true, kinds: { reply: false } })).status).toBe(200);
    const turnedOnAt = Date.now();
    await notify(person, 'mention', 'Bo mentioned you on region “Collinear ridge”');
    await notify(person, 'sample-finished', 'Your sample “Gluon jets” finished processing: 2,000 jets.');
    await notify(person, 'reply', 'Bo replied on region “Collinear ridge”');
    await sleep(2500);
    // Within the digest's day nothing is sent and the wanted notifications wait.
    expect((await outbox(admin)).queue.filter((mail) => mail.to === person.email)).toEqual([]);
    expect((await unmailed(person)).map((row) => row.kind).sort()).toEqual(['mention', 'sample-finished']);

    const digest = await waitForMail(admin, person.email, /notifications of the day/);
    expect(Date.now() - turnedOnAt).toBeGreaterThanOrEqual(DIGEST_SECONDS * 1000 - 1000);
    expect(digest.subject).toBe('Splitfield: 2 notifications of the day');
    expect(digest.text).toContain('- Bo mentioned you on region “Collinear ridge”');
    expect(digest.text).toContain('- Your sample “Gluon jets” finished processing: 2,000 jets.');
    expect(digest.text).not.toContain('replied');
    expect(digest.text).toContain('Why you got this mail: you chose one daily digest instead of one mail per event.');
    expect(await unmailed(person)).toEqual([]);

    // The next notification waits for the next day's digest.
    await notify(person, 'mention', 'Bo mentioned you again');
    await sleep(2500);
    expect((await outbox(admin)).queue.filter((mail) => mail.to === person.email)).toHaveLength(1);
  });
});

describe('a mail server that is down when a mail is due', () => {
  let server: TestServer;
  let admin: Client;
  let owner: Person;
  let smtpPort: number;

  beforeAll(async () => {
    smtpPort = await freePort();
    ({ server, admin } = await serverWithAdmin({
      env: {
        SPLITFIELD_SMTP_HOST: '127.0.0.1',
        SPLITFIELD_SMTP_PORT: String(smtpPort),
        SPLITFIELD_MAIL_RETRY_SECONDS: '1',
        SPLITFIELD_MAIL_MAX_ATTEMPTS: '4',
        SPLITFIELD_MAIL_POLL_SECONDS: '1',
      },
    }));
    owner = await newPerson(server, 'owner');
  });
  afterAll(() => server?.stop());

  const queued = async (to: string) => (await outbox(admin)).queue.find((mail) => mail.to === to);

  it('lets the action succeed, retries the mail, and delivers it once the server is back', async () => {
    const state = await outbox(admin);
    expect(state.mailer).toEqual({ mode: 'smtp', server: `127.0.0.1:${smtpPort}`, problem: null });
    const study = await newStudy(owner.client);
    const invited = await owner.client.post(`/api/studies/${study}/invitations`, { email: 'later@retry.test', role: 'viewer' });
    expect(invited.status).toBe(201);
    const failing = await eventually('two failed attempts', async () => {
      const mail = await queued('later@retry.test');
      return mail && mail.attempts >= 2 ? mail : undefined;
    });
    expect(failing.state).toBe('queued');
    expect(failing.lastError).toMatch(/ECONNREFUSED/);

    const received: string[] = [];
    const smtp = new SMTPServer({
      authOptional: true,
      disabledCommands: ['AUTH', 'STARTTLS'],
      logger: false,
      onData(stream, _session, callback) {
        let text = '';
        stream.on('data', (chunk: Buffer) => (text += chunk.toString()));
        stream.on('end', () => {
          received.push(text);
          callback();
        });
      },
    });
    await new Promise<void>((resolve) => smtp.listen(smtpPort, '127.0.0.1', resolve));
    try {
      const sent = await eventually('the mail sent after the server came back', async () => {
        const mail = await queued('later@retry.test');
        return mail?.state === 'sent' ? mail : undefined;
      });
      expect(sent.attempts).toBeGreaterThanOrEqual(3);
      expect(sent.lastError).toBeNull();
      // The demo samples' "finished" mails to their uploader may reach this server too: only the invitation counts,
      // and it arrives once.
      expect(received.filter((text) => /^To: later@retry\.test$/m.test(text))).toHaveLength(1);
    } finally {
      await new Promise<void>((resolve) => smtp.close(() => resolve()));
    }
  });

  it('gives up after the last attempt and shows the failure to admins only', async () => {
    const study = await newStudy(owner.client);
    expect((await owner.client.post(`/api/studies/${study}/invitations`, { email: 'never@retry.test', role: 'viewer' })).status).toBe(201);
    const failed = await eventually('the mail given up', async () => {
      const mail = await queued('never@retry.test');
      return mail?.state === 'failed' ? mail : undefined;
    }, 30_000);
    expect(failed).toMatchObject({ attempts: 4, purpose: 'invitation', lastError: expect.stringMatching(/ECONNREFUSED/) });
    expect((await owner.client.get('/api/admin/mail')).status).toBe(403);
    // The invitation itself stands: it is listed, and can be revoked to send a new one.
    expect((await owner.client.get(`/api/studies/${study}/invitations`)).body.invitations).toHaveLength(1);
  });
});
