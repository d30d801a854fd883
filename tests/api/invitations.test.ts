// Invitations by e-mail, end to end through the server's own local mail server: the link in the mail is signed,
// expiring and single-use; it lets a person without an account sign up (also with sign-up closed) and an
// existing user accept while signed in with the invited address.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, signIn, type TestServer } from '../support/server';
import { addMember, newPerson, newStudy, serverWithAdmin, type Person } from './fixtures';
import { expireNewestLink, linkToken, waitForMail } from './mail-fixtures';

let server: TestServer;
let admin: Client;
let owner: Person;

beforeAll(async () => {
  ({ server, admin } = await serverWithAdmin());
  owner = await newPerson(server, 'owner');
});
afterAll(() => server?.stop());

let invited = 0;
const freshAddress = (label: string) => `${label}-${++invited}-${process.pid}@invited.test`;

async function invite(studyId: number, email: string, role = 'commenter') {
  const answer = await owner.client.post(`/api/studies/${studyId}/invitations`, { email, role });
  expect(answer.status, answer.text).toBe(201);
  return answer.body.invitation;
}

async function invitationToken(email: string): Promise<string> {
  return linkToken(await waitForMail(admin, email, /invites you/), '/invite');
}

const myRole = async (client: Client, studyId: number) => (await client.get(`/api/studies/${studyId}`)).body.myRole;

describe('invitations', () => {
  it('mails a signed link that lets a person without an account sign up, with sign-up closed, and land in the study', async () => {
    const study = await newStudy(owner.client, 'Lund-plane survey');
    const email = freshAddress('newcomer');
    const invitation = await invite(study, email, 'commenter');
    expect(invitation).toMatchObject({ email, role: 'commenter', invitedBy: { id: owner.id, name: owner.name }, expired: false });
    const pending = await owner.client.get(`/api/studies/${study}/invitations`);
    expect(pending.body.invitations.map((row: { email: string }) => row.email)).toEqual([email]);

    const mail = await waitForMail(admin, email, /invites you to the study “Lund-plane survey”/);
    expect(mail.text).toContain(`${owner.name} invites you to join the study “Lund-plane survey” on Splitfield as commenter.`);
    expect(mail.text).toMatch(/Why you got this mail: an owner of the study “Lund-plane survey” invited/);
    expect(mail.text).toMatch(/How to stop it: ignore this mail/);
    const token = linkToken(mail, '/invite');
    expect(mail.html).toContain(`href="${server.baseUrl}/invite/${token}"`);

    expect((await admin.patch('/api/admin/settings', { openSignup: false })).status).toBe(200);
    try {
      expect((await new Client(server.baseUrl).post('/api/signup', { name: 'X', email, password: 'long-enough-1' })).status).toBe(403);
      const page = await new Client(server.baseUrl).get(`/invite/${token}`);
      expect(page.status).toBe(200);
      expect(page.text).toContain('Create account and join');
      const joined = await new Client(server.baseUrl).post('/api/invitations/signup', { token, name: 'Ines Newcomer', password: 'long-enough-1' });
      expect(joined.status, joined.text).toBe(201);
      expect(joined.body).toMatchObject({ studyId: study, role: 'commenter', user: { email, name: 'Ines Newcomer' } });
    } finally {
      await admin.patch('/api/admin/settings', { openSignup: true });
    }
    const newcomer = await signIn(server.baseUrl, email, 'long-enough-1');
    expect(await myRole(newcomer, study)).toBe('commenter');
    expect((await owner.client.get(`/api/studies/${study}/invitations`)).body.invitations).toEqual([]);

    const reused = await new Client(server.baseUrl).post('/api/invitations/signup', { token, name: 'Again', password: 'long-enough-2' });
    expect(reused.status).toBe(410);
    expect(reused.body.error.code).toBe('link_used');
    expect((await newcomer.post('/api/invitations/accept', { token })).status).toBe(410);
    expect((await new Client(server.baseUrl).get(`/invite/${token}`)).text).toContain('already used');
  });

  it('lets an existing user accept while signed in with the invited address, and no one else', async () => {
    const study = await newStudy(owner.client);
    const person = await newPerson(server, 'existing');
    const stranger = await newPerson(server, 'stranger');
    await invite(study, person.email, 'editor');
    const token = await invitationToken(person.email);

    expect((await new Client(server.baseUrl).post('/api/invitations/accept', { token })).status).toBe(401);
    const wrong = await stranger.client.post('/api/invitations/accept', { token });
    expect(wrong.status).toBe(403);
    expect(wrong.body.error.message).toContain(`you are signed in as ${stranger.email}`);
    expect((await stranger.client.get(`/api/studies/${study}`)).status).toBe(404);
    const taken = await new Client(server.baseUrl).post('/api/invitations/signup', { token, name: 'Twin', password: 'long-enough-1' });
    expect(taken.status).toBe(409);
    expect(taken.body.error.code).toBe('email_taken');

    const accepted = await person.client.post('/api/invitations/accept', { token });
    expect(accepted.status, accepted.text).toBe(200);
    expect(accepted.body).toEqual({ studyId: study, role: 'editor' });
    expect(await myRole(person.client, study)).toBe('editor');
    expect((await person.client.post('/api/invitations/accept', { token })).body.error.code).toBe('link_used');
  });

  it('refuses tampered, made-up and expired links, and revoked invitations', async () => {
    const study = await newStudy(owner.client);
    const email = freshAddress('tamper');
    await invite(study, email);
    const token = await invitationToken(email);
    const [nonce, signature] = token.split('.');
    const flipped = `${nonce}.${signature[0] === 'A' ? 'B' : 'A'}${signature.slice(1)}`;
    const otherNonce = `${nonce[0] === 'A' ? 'B' : 'A'}${nonce.slice(1)}.${signature}`;
    for (const bad of [flipped, otherNonce, 'not-a-token', `${nonce}.`]) {
      const answer = await new Client(server.baseUrl).post('/api/invitations/signup', { token: bad, name: 'Mallory', password: 'long-enough-1' });
      expect(answer.status, bad).toBe(404);
      expect(answer.body.error.code).toBe('link_invalid');
    }
    const tooLong = await new Client(server.baseUrl).post('/api/invitations/signup', { token: 'x'.repeat(101), name: 'M', password: 'long-enough-1' });
    expect(tooLong.status).toBe(400);
    expect(tooLong.body.error.details[0].path).toBe('token');

    await expireNewestLink(server, 'invitations');
    const expired = await new Client(server.baseUrl).post('/api/invitations/signup', { token, name: 'Late', password: 'long-enough-1' });
    expect(expired.status).toBe(410);
    expect(expired.body.error.code).toBe('link_expired');
    expect((await new Client(server.baseUrl).get(`/invite/${token}`)).text).toContain('expired on');
    const listed = (await owner.client.get(`/api/studies/${study}/invitations`)).body.invitations;
    expect(listed).toEqual([expect.objectContaining({ email, expired: true })]);
    // An expired invitation no longer blocks a new one.
    await invite(study, email);
    const newToken = linkToken(await waitForMail(admin, email, /invites you/, 2), '/invite');
    expect(newToken).not.toBe(token);

    const pending = (await owner.client.get(`/api/studies/${study}/invitations`)).body.invitations;
    const current = pending.find((row: { expired: boolean }) => !row.expired);
    expect((await owner.client.delete(`/api/studies/${study}/invitations/${current.id}`)).status).toBe(204);
    expect((await owner.client.delete(`/api/studies/${study}/invitations/${current.id}`)).status).toBe(404);
    const revoked = await new Client(server.baseUrl).post('/api/invitations/signup', { token: newToken, name: 'Late', password: 'long-enough-1' });
    expect(revoked.status).toBe(404);
    expect(revoked.body.error.code).toBe('link_invalid');
  });

  it('refuses an invitation to someone already a member, and a second pending one', async () => {
    const study = await newStudy(owner.client);
    const member = await newPerson(server, 'member');
    await addMember(owner.client, study, member.email, 'viewer');
    const again = await owner.client.post(`/api/studies/${study}/invitations`, { email: member.email.toUpperCase(), role: 'owner' });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('already_member');
    expect(await myRole(member.client, study)).toBe('viewer');
    const email = freshAddress('twice');
    await invite(study, email);
    const second = await owner.client.post(`/api/studies/${study}/invitations`, { email, role: 'viewer' });
    expect(second.status).toBe(409);
    expect(second.body.error.code).toBe('already_invited');
    const bad = await owner.client.post(`/api/studies/${study}/invitations`, { email: 'not an address', role: 'boss' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.map((detail: { path: string }) => detail.path).sort()).toEqual(['email', 'role']);
  });

  it('shows script and HTML in names and titles as text, in both parts of the mail', async () => {
    const sneaky = await newPerson(server, 'sneaky');
    const name = '<img src=x onerror=alert(1)> & <b>Bold</b>';
    expect((await sneaky.client.patch('/api/me', { name })).status).toBe(200);
    const title = '<script>alert("study")</script>';
    const study = await newStudy(sneaky.client, title);
    const email = freshAddress('target');
    expect((await sneaky.client.post(`/api/studies/${study}/invitations`, { email, role: 'viewer' })).status).toBe(201);
    const mail = await waitForMail(admin, email, /invites you/);
    expect(mail.subject).toBe(`${name} invites you to the study “${title}”`);
    expect(mail.text).toContain(`${name} invites you to join the study “${title}”`);
    // The Outbox's HTML part is sanitised; what it shows of the names is their text.
    expect(mail.html).not.toMatch(/<img|<script|<b>/);
    expect(mail.html).toContain('&lt;img src=x onerror=alert(1)&gt; &amp; &lt;b&gt;Bold&lt;/b&gt;');
    expect(mail.html).toContain('&lt;script&gt;alert("study")&lt;/script&gt;');
    const page = await new Client(server.baseUrl).get(`/invite/${linkToken(mail, '/invite')}`);
    expect(page.text).not.toContain('<script>alert("study")');
    expect(page.text).toContain('&lt;script&gt;alert(&quot;study&quot;)&lt;/script&gt;');
  });
});
