// Who may call what: every API route and method, for every kind of caller, with the status each must get.
// A route file under app/api whose route or method is missing here fails the coverage test, so new routes
// have to be added to this table.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, signIn, type TestServer } from '../support/server';
import { addMember, newAccount, newNote, newPerson, newStudy, serverWithAdmin, type Person } from './fixtures';
import { linkToken, waitForMail } from './mail-fixtures';
import { apiRouteMethods } from './route-inventory';
import { jetsFileText, upload, uploadDone, uploadForm } from './sample-fixtures';

const ACTORS = ['anonymous', 'nonMember', 'viewer', 'commenter', 'editor', 'owner', 'admin'] as const;
type Actor = (typeof ACTORS)[number];

interface World {
  server: TestServer;
  clients: Record<Actor, Client>;
  /** Owned by `owner`, with `viewer`, `commenter` and `editor` as members; `admin` (a site admin) is not one. */
  studyId: number;
  people: Record<'owner' | 'viewer' | 'commenter' | 'editor', Person>;
  /** A processed sample of the study, uploaded by `owner`. */
  sampleId: number;
  /** E-mail and password of every signed-in actor, for a second session of the same person. */
  accounts: Record<Exclude<Actor, 'anonymous'>, { email: string; password: string }>;
  /** Another processed sample of the study (for contrasts). */
  secondSampleId: number;
  /** A tagger of the study saved from a Separation of the two samples, and its document (for imports). */
  taggerId: number;
  taggerDocument: Record<string, unknown>;
}

interface Call {
  path: string;
  body?: unknown;
  /** Sent as multipart/form-data instead of `body`. */
  multipart?: FormData;
  /** Checked after a refused call: what the call must not have changed. */
  unchanged?: () => Promise<void>;
  /** Sent by this client instead of the actor's (a call that would end the actor's own session). */
  sender?: Client;
}

interface Row {
  method: 'GET' | 'POST' | 'PATCH' | 'DELETE';
  /** The route as its folder under app/ names it. */
  route: string;
  /** Makes what the call acts on (fresh where the call changes or removes it) and says where to send it. */
  call: (world: World, actor: Actor) => Promise<Call>;
  expected: Record<Actor, number>;
}

/** Expected statuses in the order of ACTORS: anonymous, nonMember, viewer, commenter, editor, owner, admin. */
function statuses(...codes: number[]): Record<Actor, number> {
  return Object.fromEntries(ACTORS.map((actor, i) => [actor, codes[i]])) as Record<Actor, number>;
}

const admin = (world: World) => world.clients.admin;
const inStudy = (world: World, rest = '') => `/api/studies/${world.studyId}${rest}`;

async function freshStudy(world: World): Promise<number> {
  const owner = world.people.owner;
  const study = await newStudy(owner.client, 'Throwaway study');
  for (const role of ['viewer', 'commenter', 'editor'] as const) {
    await addMember(owner.client, study, world.people[role].email, role);
  }
  return study;
}

async function memberRole(world: World, userId: number): Promise<string | undefined> {
  const detail = await world.people.owner.client.get(`/api/studies/${world.studyId}`);
  return detail.body.members.find((member: { userId: number }) => member.userId === userId)?.role;
}

/** A call on a new viewer of the matrix study, who must still be a viewer when the call is refused. */
async function onFreshMember(world: World, body?: unknown): Promise<Call> {
  const account = await newAccount(world.server, 'target');
  await addMember(world.people.owner.client, world.studyId, account.email, 'viewer');
  return {
    path: inStudy(world, `/members/${account.id}`),
    body,
    unchanged: async () => expect(await memberRole(world, account.id)).toBe('viewer'),
  };
}

/** A fresh sample of the matrix study (queued or processing: deleting or cancelling it works either way). */
async function freshSample(world: World, label: string): Promise<Call> {
  const made = await upload(world.people.owner.client, { studyId: world.studyId, file: jetsFileText(20, freshSeed++), name: label });
  expect(made.status, made.text).toBe(202);
  const path = `/api/samples/${made.body.sample.id}`;
  return { path, unchanged: async () => expect((await world.people.owner.client.get(path)).status).toBe(200) };
}
let freshSeed = 7000;

/** A second session of the actor's person (anonymous stays anonymous). */
async function secondSession(world: World, actor: Actor): Promise<Client> {
  if (actor === 'anonymous') return new Client(world.server.baseUrl);
  const { email, password } = world.accounts[actor];
  return signIn(world.server.baseUrl, email, password);
}

const inSample = (world: World, rest = '') => `/api/samples/${world.sampleId}${rest}`;

async function tokenNames(client: Client): Promise<string[]> {
  return (await client.get('/api/tokens')).body.tokens.map((token: { name: string }) => token.name);
}

async function taggerNames(world: World): Promise<string[]> {
  const list = await world.people.owner.client.get(inStudy(world, '/taggers'));
  return list.body.taggers.map((tagger: { name: string }) => tagger.name);
}

/** A fresh tagger of the matrix study, imported by the owner. */
async function freshTagger(world: World, name: string): Promise<Call> {
  const made = await world.people.owner.client.post(inStudy(world, '/taggers'), { document: { ...world.taggerDocument, name } });
  expect(made.status, made.text).toBe(201);
  return { path: inStudy(world, `/taggers/${made.body.tagger.id}`), unchanged: async () => expect(await taggerNames(world)).toContain(name) };
}

async function entryBodies(world: World): Promise<string[]> {
  const list = await world.people.owner.client.get(`/api/studies/${world.studyId}/entries`);
  return list.body.entries.map((entry: { body: string }) => entry.body);
}

async function invitedEmails(world: World): Promise<string[]> {
  const list = await world.people.owner.client.get(inStudy(world, '/invitations'));
  return list.body.invitations.map((invitation: { email: string }) => invitation.email);
}

/** The link token of a new invitation of `email` into a fresh study of a fresh person, read from the Outbox. */
async function invitationTokenFor(world: World, email: string): Promise<string> {
  const inviter = await newPerson(world.server, 'inviter');
  const study = await newStudy(inviter.client, 'Invitation study');
  const made = await inviter.client.post(`/api/studies/${study}/invitations`, { email, role: 'viewer' });
  expect(made.status, made.text).toBe(201);
  return linkToken(await waitForMail(admin(world), email, /invites you/), '/invite');
}

const RECTANGLE = { axes: { x: 'lnInvDelta', y: 'lnKt' }, shape: { type: 'rectangle', x1: 1, x2: 2, y1: 0, y2: 1 } };

/** A new region of the matrix study, drawn by its owner; its path, and a check that it is still as made. */
async function freshRegion(world: World, title: string): Promise<{ path: string; unchanged: () => Promise<void> }> {
  const made = await world.people.owner.client.post(inStudy(world, '/regions'), { title, comment: 'First words.', geometry: RECTANGLE });
  expect(made.status, made.text).toBe(201);
  const path = inStudy(world, `/regions/${made.body.region.id}`);
  return {
    path,
    unchanged: async () => {
      const found = await world.people.owner.client.get(path);
      expect(found.status).toBe(200);
      expect(found.body.region.title).toBe(title);
    },
  };
}

/** A comment of the owner on a fresh region, and a check that its text is still as written. */
async function ownersComment(world: World, label: string): Promise<Call> {
  const region = await freshRegion(world, `Region for ${label}`);
  const made = await world.people.owner.client.post(`${region.path}/comments`, { body: `Owner's words ${label}` });
  expect(made.status, made.text).toBe(201);
  return {
    path: `${region.path}/comments/${made.body.comment.id}`,
    unchanged: async () => {
      const thread = (await world.people.owner.client.get(`${region.path}/comments`)).body.comments;
      expect(thread.map((c: { body: string }) => c.body)).toContain(`Owner's words ${label}`);
    },
  };
}

async function freshCategory(world: World, name: string): Promise<Call> {
  const made = await world.people.owner.client.post(inStudy(world, '/region-categories'), { name, colour: '#1f77b4' });
  expect(made.status, made.text).toBe(201);
  return {
    path: inStudy(world, `/region-categories/${made.body.category.id}`),
    unchanged: async () => {
      const names = (await world.people.owner.client.get(inStudy(world, '/region-categories'))).body.categories.map((c: { name: string }) => c.name);
      expect(names).toContain(name);
    },
  };
}

async function regionTitles(world: World): Promise<string[]> {
  return (await world.people.owner.client.get(inStudy(world, '/regions'))).body.regions.map((r: { title: string }) => r.title);
}

//                                                    anon nonMem viewer comm  editor owner admin
const ROWS: Row[] = [
  {
    method: 'GET',
    route: '/api/auth/[...nextauth]',
    call: async () => ({ path: '/api/auth/session' }),
    expected: statuses(200, 200, 200, 200, 200, 200, 200),
  },
  {
    // next-auth's own csrf check refuses a form post without its token, whoever sends it.
    method: 'POST',
    route: '/api/auth/[...nextauth]',
    call: async () => ({ path: '/api/auth/signout' }),
    expected: statuses(302, 302, 302, 302, 302, 302, 302),
  },
  {
    method: 'GET',
    route: '/api/signup',
    call: async () => ({ path: '/api/signup' }),
    expected: statuses(200, 200, 200, 200, 200, 200, 200),
  },
  {
    method: 'POST',
    route: '/api/signup',
    call: async (_world, actor) => ({
      path: '/api/signup',
      body: { name: 'New', email: `signup-by-${actor}-${Date.now()}@matrix.test`, password: 'long-enough' },
    }),
    expected: statuses(201, 201, 201, 201, 201, 201, 201),
  },
  {
    method: 'GET',
    route: '/api/me',
    call: async () => ({ path: '/api/me' }),
    expected: statuses(401, 200, 200, 200, 200, 200, 200),
  },
  {
    method: 'PATCH',
    route: '/api/me',
    call: async (_world, actor) => ({ path: '/api/me', body: { name: `The ${actor}` } }),
    expected: statuses(401, 200, 200, 200, 200, 200, 200),
  },
  {
    method: 'GET',
    route: '/api/admin/users',
    call: async () => ({ path: '/api/admin/users' }),
    expected: statuses(401, 403, 403, 403, 403, 403, 200),
  },
  {
    method: 'PATCH',
    route: '/api/admin/users/[userId]',
    call: async (world) => {
      const target = await newAccount(world.server, 'disable-me');
      return {
        path: `/api/admin/users/${target.id}`,
        body: { disabled: true },
        unchanged: async () => {
          const users = (await admin(world).get('/api/admin/users')).body.users;
          expect(users.find((user: { id: number }) => user.id === target.id).disabled).toBe(false);
        },
      };
    },
    expected: statuses(401, 403, 403, 403, 403, 403, 200),
  },
  {
    method: 'GET',
    route: '/api/admin/settings',
    call: async () => ({ path: '/api/admin/settings' }),
    expected: statuses(401, 403, 403, 403, 403, 403, 200),
  },
  {
    method: 'GET',
    route: '/api/admin/processing',
    call: async () => ({ path: '/api/admin/processing' }),
    expected: statuses(401, 403, 403, 403, 403, 403, 200),
  },
  {
    method: 'PATCH',
    route: '/api/admin/settings',
    // Keeps sign-up open: the other rows need it.
    call: async () => ({ path: '/api/admin/settings', body: { openSignup: true } }),
    expected: statuses(401, 403, 403, 403, 403, 403, 200),
  },
  {
    method: 'GET',
    route: '/api/studies',
    call: async () => ({ path: '/api/studies' }),
    expected: statuses(401, 200, 200, 200, 200, 200, 200),
  },
  {
    method: 'POST',
    route: '/api/studies',
    call: async (_world, actor) => ({ path: '/api/studies', body: { title: `Made by ${actor}` } }),
    expected: statuses(401, 201, 201, 201, 201, 201, 201),
  },
  {
    method: 'GET',
    route: '/api/studies/[studyId]',
    call: async (world) => ({ path: inStudy(world) }),
    expected: statuses(401, 404, 200, 200, 200, 200, 200),
  },
  {
    method: 'PATCH',
    route: '/api/studies/[studyId]',
    call: async (world, actor) => ({
      path: inStudy(world),
      body: { description: `Changed by ${actor}` },
      unchanged: async () => {
        const detail = await world.people.owner.client.get(inStudy(world));
        expect(detail.body.study.description).not.toBe(`Changed by ${actor}`);
      },
    }),
    expected: statuses(401, 404, 403, 403, 200, 200, 200),
  },
  {
    method: 'DELETE',
    route: '/api/studies/[studyId]',
    call: async (world) => {
      const study = await freshStudy(world);
      return {
        path: `/api/studies/${study}`,
        unchanged: async () => expect((await world.people.owner.client.get(`/api/studies/${study}`)).status).toBe(200),
      };
    },
    expected: statuses(401, 404, 403, 403, 403, 204, 204),
  },
  {
    method: 'POST',
    route: '/api/studies/[studyId]/members',
    call: async (world) => {
      const invited = await newAccount(world.server, 'invited');
      return {
        path: inStudy(world, '/members'),
        body: { email: invited.email, role: 'viewer' },
        unchanged: async () => expect(await memberRole(world, invited.id)).toBeUndefined(),
      };
    },
    expected: statuses(401, 404, 403, 403, 403, 201, 201),
  },
  {
    method: 'PATCH',
    route: '/api/studies/[studyId]/members/[userId]',
    call: (world) => onFreshMember(world, { role: 'commenter' }),
    expected: statuses(401, 404, 403, 403, 403, 200, 200),
  },
  {
    method: 'DELETE',
    route: '/api/studies/[studyId]/members/[userId]',
    call: (world) => onFreshMember(world),
    expected: statuses(401, 404, 403, 403, 403, 204, 204),
  },
  {
    method: 'GET',
    route: '/api/studies/[studyId]/entries',
    call: async (world) => ({ path: inStudy(world, '/entries') }),
    expected: statuses(401, 404, 200, 200, 200, 200, 200),
  },
  {
    method: 'POST',
    route: '/api/studies/[studyId]/entries',
    call: async (world, actor) => ({
      path: inStudy(world, '/entries'),
      body: { kind: 'note', body: `Written by ${actor}` },
      unchanged: async () => expect(await entryBodies(world)).not.toContain(`Written by ${actor}`),
    }),
    expected: statuses(401, 404, 403, 403, 201, 201, 201),
  },
  {
    method: 'PATCH',
    route: '/api/studies/[studyId]/entries/[entryId]',
    call: async (world, actor) => {
      const entry = await newNote(world.people.owner.client, world.studyId, 'original');
      return {
        path: inStudy(world, `/entries/${entry}`),
        body: { body: `Edited by ${actor}` },
        unchanged: async () => expect(await entryBodies(world)).not.toContain(`Edited by ${actor}`),
      };
    },
    expected: statuses(401, 404, 403, 403, 200, 200, 200),
  },
  {
    method: 'DELETE',
    route: '/api/studies/[studyId]/entries/[entryId]',
    call: async (world, actor) => {
      const body = `Keep unless deleted by ${actor}`;
      const entry = await newNote(world.people.owner.client, world.studyId, body);
      return {
        path: inStudy(world, `/entries/${entry}`),
        unchanged: async () => expect(await entryBodies(world)).toContain(body),
      };
    },
    expected: statuses(401, 404, 403, 403, 204, 204, 204),
  },
  {
    method: 'GET',
    route: '/api/samples',
    call: async () => ({ path: '/api/samples' }),
    expected: statuses(401, 200, 200, 200, 200, 200, 200),
  },
  {
    method: 'POST',
    route: '/api/samples/upload',
    call: async (world, actor) => ({
      path: '/api/samples/upload',
      // Distinct bytes for every caller, so that no upload is answered as a duplicate of another.
      multipart: uploadForm({ studyId: world.studyId, name: `Uploaded by ${actor}`, file: jetsFileText(5, freshSeed++) }),
      unchanged: async () => {
        const names = (await world.people.owner.client.get(`/api/samples?studyId=${world.studyId}`)).body.samples;
        expect(names.map((sample: { name: string }) => sample.name)).not.toContain(`Uploaded by ${actor}`);
      },
    }),
    expected: statuses(401, 404, 403, 403, 202, 202, 202),
  },
  {
    method: 'GET',
    route: '/api/samples/[sampleId]',
    call: async (world) => ({ path: inSample(world) }),
    expected: statuses(401, 404, 200, 200, 200, 200, 200),
  },
  {
    method: 'DELETE',
    route: '/api/samples/[sampleId]',
    call: (world, actor) => freshSample(world, `Delete as ${actor}`),
    expected: statuses(401, 404, 403, 403, 204, 204, 204),
  },
  {
    // A processed sample has nothing to cancel: it is answered as it stands.
    method: 'POST',
    route: '/api/samples/[sampleId]/cancel',
    call: async (world) => ({
      path: inSample(world, '/cancel'),
      unchanged: async () => expect((await world.people.owner.client.get(inSample(world))).body.sample.state).toBe('done'),
    }),
    expected: statuses(401, 404, 403, 403, 200, 200, 200),
  },
  {
    method: 'GET',
    route: '/api/samples/[sampleId]/jets',
    call: async (world) => ({ path: inSample(world, '/jets?limit=5') }),
    expected: statuses(401, 404, 200, 200, 200, 200, 200),
  },
  {
    method: 'GET',
    route: '/api/samples/[sampleId]/plane',
    call: async (world) => ({ path: inSample(world, '/plane') }),
    expected: statuses(401, 404, 200, 200, 200, 200, 200),
  },
  {
    method: 'GET',
    route: '/api/samples/[sampleId]/map',
    call: async (world) => ({ path: inSample(world, '/map') }),
    expected: statuses(401, 404, 200, 200, 200, 200, 200),
  },
  {
    // A sample of a study the caller cannot see answers 404, as one that does not exist.
    method: 'GET',
    route: '/api/contrasts',
    call: async (world) => ({ path: `/api/contrasts?samples=${world.sampleId},${world.secondSampleId}` }),
    expected: statuses(401, 404, 200, 200, 200, 200, 200),
  },
  {
    method: 'GET',
    route: '/api/projections',
    call: async (world) => ({ path: `/api/projections?samples=${world.sampleId}` }),
    expected: statuses(401, 404, 200, 200, 200, 200, 200),
  },
  {
    method: 'GET',
    route: '/api/separations',
    call: async (world) => ({ path: `/api/separations?signal=${world.sampleId}&background=${world.secondSampleId}` }),
    expected: statuses(401, 404, 200, 200, 200, 200, 200),
  },
  {
    method: 'GET',
    route: '/api/studies/[studyId]/taggers',
    call: async (world) => ({ path: inStudy(world, '/taggers') }),
    expected: statuses(401, 404, 200, 200, 200, 200, 200),
  },
  {
    method: 'POST',
    route: '/api/studies/[studyId]/taggers',
    call: async (world, actor) => ({
      path: inStudy(world, '/taggers'),
      body: { document: { ...world.taggerDocument, name: `Imported by ${actor}` } },
      unchanged: async () => expect(await taggerNames(world)).not.toContain(`Imported by ${actor}`),
    }),
    expected: statuses(401, 404, 403, 403, 201, 201, 201),
  },
  {
    method: 'GET',
    route: '/api/studies/[studyId]/taggers/[taggerId]',
    call: async (world) => ({ path: inStudy(world, `/taggers/${world.taggerId}`) }),
    expected: statuses(401, 404, 200, 200, 200, 200, 200),
  },
  {
    method: 'DELETE',
    route: '/api/studies/[studyId]/taggers/[taggerId]',
    call: (world, actor) => freshTagger(world, `Kept unless deleted by ${actor}`),
    expected: statuses(401, 404, 403, 403, 204, 204, 204),
  },
  {
    // The tagger's study and the sample's study must both be visible.
    method: 'GET',
    route: '/api/studies/[studyId]/taggers/[taggerId]/scores',
    call: async (world) => ({ path: inStudy(world, `/taggers/${world.taggerId}/scores?sample=${world.sampleId}`) }),
    expected: statuses(401, 404, 200, 200, 200, 200, 200),
  },
  {
    method: 'GET',
    route: '/api/samples/[sampleId]/provenance',
    call: async (world) => ({ path: inSample(world, '/provenance') }),
    expected: statuses(401, 404, 200, 200, 200, 200, 200),
  },
  {
    method: 'GET',
    route: '/api/samples/[sampleId]/export',
    call: async (world) => ({ path: inSample(world, '/export') }),
    expected: statuses(401, 404, 200, 200, 200, 200, 200),
  },
  {
    method: 'GET',
    route: '/api/tokens',
    call: async () => ({ path: '/api/tokens' }),
    expected: statuses(401, 200, 200, 200, 200, 200, 200),
  },
  {
    method: 'POST',
    route: '/api/tokens',
    call: async (_world, actor) => ({ path: '/api/tokens', body: { name: `Script of ${actor}` } }),
    expected: statuses(401, 201, 201, 201, 201, 201, 201),
  },
  {
    // Only one's own tokens: everyone else's look like tokens that do not exist, site admins included.
    method: 'DELETE',
    route: '/api/tokens/[tokenId]',
    call: async (world, actor) => {
      const owner = world.people.owner.client;
      const made = await owner.post('/api/tokens', { name: `Kept unless ${actor} revokes it` });
      expect(made.status, made.text).toBe(201);
      return {
        path: `/api/tokens/${made.body.token.id}`,
        unchanged: async () => expect(await tokenNames(owner)).toContain(`Kept unless ${actor} revokes it`),
      };
    },
    expected: statuses(401, 404, 404, 404, 404, 204, 404),
  },
  {
    method: 'POST',
    route: '/api/samples/[sampleId]/attach',
    // Into a fresh study where the actor has the same role as in the matrix study.
    call: async (world) => ({ path: inSample(world, '/attach'), body: { studyId: await freshStudy(world) } }),
    expected: statuses(401, 404, 403, 403, 201, 201, 201),
  },
  {
    method: 'GET',
    route: '/api/studies/[studyId]/invitations',
    call: async (world) => ({ path: inStudy(world, '/invitations') }),
    expected: statuses(401, 404, 403, 403, 403, 200, 200),
  },
  {
    method: 'POST',
    route: '/api/studies/[studyId]/invitations',
    call: async (world, actor) => {
      const email = `invited-by-${actor}@matrix.test`.toLowerCase();
      return {
        path: inStudy(world, '/invitations'),
        body: { email, role: 'viewer' },
        unchanged: async () => expect(await invitedEmails(world)).not.toContain(email),
      };
    },
    expected: statuses(401, 404, 403, 403, 403, 201, 201),
  },
  {
    method: 'DELETE',
    route: '/api/studies/[studyId]/invitations/[invitationId]',
    call: async (world, actor) => {
      const email = `kept-unless-${actor}-revokes@matrix.test`.toLowerCase();
      const made = await world.people.owner.client.post(inStudy(world, '/invitations'), { email, role: 'viewer' });
      expect(made.status, made.text).toBe(201);
      return {
        path: inStudy(world, `/invitations/${made.body.invitation.id}`),
        unchanged: async () => expect(await invitedEmails(world)).toContain(email),
      };
    },
    expected: statuses(401, 404, 403, 403, 403, 204, 204),
  },
  {
    // Each signed-in actor accepts an invitation to their own address (anyone else is refused, see invitations.test.ts).
    method: 'POST',
    route: '/api/invitations/accept',
    call: async (world, actor) => {
      const email = actor === 'anonymous' ? 'nobody-accepts@matrix.test' : world.accounts[actor].email;
      return { path: '/api/invitations/accept', body: { token: await invitationTokenFor(world, email) } };
    },
    expected: statuses(401, 200, 200, 200, 200, 200, 200),
  },
  {
    // The invitation is the permission: whoever holds the link may create the invited account.
    method: 'POST',
    route: '/api/invitations/signup',
    call: async (world, actor) => ({
      path: '/api/invitations/signup',
      body: { token: await invitationTokenFor(world, `joiner-${actor}@matrix.test`), name: `Joiner ${actor}`, password: 'long-enough' },
    }),
    expected: statuses(201, 201, 201, 201, 201, 201, 201),
  },
  {
    method: 'POST',
    route: '/api/password-reset',
    call: async (_world, actor) => ({ path: '/api/password-reset', body: { email: `reset-by-${actor}@matrix.test` } }),
    expected: statuses(202, 202, 202, 202, 202, 202, 202),
  },
  {
    method: 'POST',
    route: '/api/password-reset/complete',
    call: async (world, actor) => {
      const account = await newAccount(world.server, `reset-${actor}`);
      await new Client(world.server.baseUrl).post('/api/password-reset', { email: account.email });
      const mail = await waitForMail(admin(world), account.email, /Reset your Splitfield password/);
      return { path: '/api/password-reset/complete', body: { token: linkToken(mail, '/reset-password'), password: 'a-new-password' } };
    },
    expected: statuses(200, 200, 200, 200, 200, 200, 200),
  },
  {
    method: 'GET',
    route: '/api/me/mail',
    call: async () => ({ path: '/api/me/mail' }),
    expected: statuses(401, 200, 200, 200, 200, 200, 200),
  },
  {
    method: 'PATCH',
    route: '/api/me/mail',
    call: async () => ({ path: '/api/me/mail', body: { kinds: { reply: false } } }),
    expected: statuses(401, 200, 200, 200, 200, 200, 200),
  },
  {
    method: 'GET',
    route: '/api/admin/mail',
    call: async () => ({ path: '/api/admin/mail' }),
    expected: statuses(401, 403, 403, 403, 403, 403, 200),
  },
  {
    method: 'GET',
    route: '/api/admin/mail/[mailId]',
    call: async (world) => {
      const mail = await waitForMail(admin(world), 'invited-by-owner@matrix.test', /invites you/);
      return { path: `/api/admin/mail/${mail.id}` };
    },
    expected: statuses(401, 403, 403, 403, 403, 403, 200),
  },
  {
    method: 'GET',
    route: '/api/studies/[studyId]/regions',
    call: async (world) => ({ path: inStudy(world, '/regions') }),
    expected: statuses(401, 404, 200, 200, 200, 200, 200),
  },
  {
    method: 'POST',
    route: '/api/studies/[studyId]/regions',
    call: async (world, actor) => ({
      path: inStudy(world, '/regions'),
      body: { title: `Drawn by ${actor}`, comment: 'Look here.', geometry: RECTANGLE },
      unchanged: async () => expect(await regionTitles(world)).not.toContain(`Drawn by ${actor}`),
    }),
    expected: statuses(401, 404, 403, 201, 201, 201, 201),
  },
  {
    method: 'GET',
    route: '/api/studies/[studyId]/regions/[regionId]',
    call: async (world) => ({ path: (await freshRegion(world, 'Read me')).path }),
    expected: statuses(401, 404, 200, 200, 200, 200, 200),
  },
  {
    // Title, category and shape are the author's (the owner here) and editors'.
    method: 'PATCH',
    route: '/api/studies/[studyId]/regions/[regionId]',
    call: async (world, actor) => ({ ...(await freshRegion(world, `Renamed unless by ${actor}`)), body: { title: `Renamed by ${actor}` } }),
    expected: statuses(401, 404, 403, 403, 200, 200, 200),
  },
  {
    method: 'DELETE',
    route: '/api/studies/[studyId]/regions/[regionId]',
    call: async (world, actor) => freshRegion(world, `Kept unless deleted by ${actor}`),
    expected: statuses(401, 404, 403, 403, 204, 204, 204),
  },
  {
    method: 'GET',
    route: '/api/studies/[studyId]/regions/[regionId]/comments',
    call: async (world) => ({ path: `${(await freshRegion(world, 'Thread')).path}/comments` }),
    expected: statuses(401, 404, 200, 200, 200, 200, 200),
  },
  {
    method: 'POST',
    route: '/api/studies/[studyId]/regions/[regionId]/comments',
    call: async (world, actor) => {
      const region = await freshRegion(world, `Commented on by ${actor}`);
      return {
        path: `${region.path}/comments`,
        body: { body: `Said by ${actor}` },
        unchanged: async () => {
          const thread = (await world.people.owner.client.get(`${region.path}/comments`)).body.comments;
          expect(thread).toHaveLength(1);
        },
      };
    },
    expected: statuses(401, 404, 403, 201, 201, 201, 201),
  },
  {
    // Only one's own comment, whatever the role.
    method: 'PATCH',
    route: '/api/studies/[studyId]/regions/[regionId]/comments/[commentId]',
    call: async (world, actor) => ({ ...(await ownersComment(world, `edit-${actor}`)), body: { body: `Changed by ${actor}` } }),
    expected: statuses(401, 404, 403, 403, 403, 200, 403),
  },
  {
    // One's own, or any as an owner (or a site admin).
    method: 'DELETE',
    route: '/api/studies/[studyId]/regions/[regionId]/comments/[commentId]',
    call: async (world, actor) => ownersComment(world, `delete-${actor}`),
    expected: statuses(401, 404, 403, 403, 403, 204, 204),
  },
  {
    method: 'GET',
    route: '/api/studies/[studyId]/region-categories',
    call: async (world) => ({ path: inStudy(world, '/region-categories') }),
    expected: statuses(401, 404, 200, 200, 200, 200, 200),
  },
  {
    method: 'POST',
    route: '/api/studies/[studyId]/region-categories',
    call: async (world, actor) => ({ path: inStudy(world, '/region-categories'), body: { name: `Kind by ${actor}`, colour: '#aa3377' } }),
    expected: statuses(401, 404, 403, 403, 201, 201, 201),
  },
  {
    method: 'PATCH',
    route: '/api/studies/[studyId]/region-categories/[categoryId]',
    call: async (world, actor) => ({ ...(await freshCategory(world, `Recoloured unless by ${actor}`)), body: { colour: '#228833' } }),
    expected: statuses(401, 404, 403, 403, 200, 200, 200),
  },
  {
    method: 'DELETE',
    route: '/api/studies/[studyId]/region-categories/[categoryId]',
    call: async (world, actor) => freshCategory(world, `Kept unless removed by ${actor}`),
    expected: statuses(401, 404, 403, 403, 204, 204, 204),
  },
  {
    method: 'GET',
    route: '/api/studies/[studyId]/activity',
    call: async (world) => ({ path: inStudy(world, '/activity') }),
    expected: statuses(401, 404, 200, 200, 200, 200, 200),
  },
  {
    method: 'POST',
    route: '/api/studies/[studyId]/activity',
    call: async (world) => ({ path: inStudy(world, '/activity') }),
    expected: statuses(401, 404, 204, 204, 204, 204, 204),
  },
  // Last: it ends every session of each actor's person, so no row may come after it.
  {
    method: 'DELETE',
    route: '/api/me/sessions',
    call: async (world, actor) => ({ path: '/api/me/sessions', sender: await secondSession(world, actor) }),
    expected: statuses(401, 204, 204, 204, 204, 204, 204),
  },
];

let world: World;

beforeAll(async () => {
  // The owner queues many samples and writes many comments here: the per-person limits are not what this table is about.
  const { server, admin: adminClient } = await serverWithAdmin({
    env: { SPLITFIELD_MAX_JOBS_PER_USER: '1000', SPLITFIELD_RESETS_PER_ADDRESS: '1000', SPLITFIELD_COMMENTS_PER_MINUTE: '1000' },
  });
  const people = {
    owner: await newPerson(server, 'owner'),
    viewer: await newPerson(server, 'viewer'),
    commenter: await newPerson(server, 'commenter'),
    editor: await newPerson(server, 'editor'),
  };
  const outsider = await newPerson(server, 'non-member');
  const studyId = await newStudy(people.owner.client, 'Matrix study');
  for (const role of ['viewer', 'commenter', 'editor'] as const) {
    await addMember(people.owner.client, studyId, people[role].email, role);
  }
  const sample = await uploadDone(people.owner.client, { studyId, name: 'Matrix sample', file: jetsFileText(50, 1) });
  const second = await uploadDone(people.owner.client, { studyId, name: 'Second matrix sample', file: jetsFileText(50, 2) });
  const separation = await people.owner.client.post(`/api/studies/${studyId}/entries`, { kind: 'separation', settings: { signalSampleId: sample.id, backgroundSampleId: second.id } });
  expect(separation.status, separation.text).toBe(201);
  const tagger = await people.owner.client.post(`/api/studies/${studyId}/taggers`, { entryId: separation.body.entry.id, name: 'Matrix tagger' });
  expect(tagger.status, tagger.text).toBe(201);
  const taggerDocument = (await people.owner.client.get(`/api/studies/${studyId}/taggers/${tagger.body.tagger.id}`)).body.document;
  world = {
    server,
    studyId,
    sampleId: sample.id,
    secondSampleId: second.id,
    taggerId: tagger.body.tagger.id,
    taggerDocument,
    people,
    accounts: {
      nonMember: outsider,
      viewer: people.viewer,
      commenter: people.commenter,
      editor: people.editor,
      owner: people.owner,
      admin: server.credentials.admin,
    },
    clients: {
      anonymous: new Client(server.baseUrl),
      nonMember: outsider.client,
      viewer: people.viewer.client,
      commenter: people.commenter.client,
      editor: people.editor.client,
      owner: people.owner.client,
      admin: adminClient,
    },
  };
});
afterAll(() => world?.server.stop());

describe.each(ROWS)('$method $route', (row) => {
  it.each(ACTORS)('as %s', async (actor) => {
    const call = await row.call(world, actor);
    const sender = call.sender ?? world.clients[actor];
    const response = await sender.send(row.method, call.path, { body: call.body, multipart: call.multipart });
    expect(response.status, `${row.method} ${call.path} as ${actor}: ${response.text.slice(0, 300)}`).toBe(
      row.expected[actor],
    );
    if (response.status >= 400) {
      if (row.route.startsWith('/api/') && !row.route.startsWith('/api/auth/')) {
        expect(response.body.error.code).toEqual(expect.any(String));
      }
      await call.unchanged?.();
    }
  });
});

describe('coverage of the table', () => {
  it('has a row for every route and method under app/api, and no row for anything else', () => {
    const inTable = ROWS.map((row) => `${row.method} ${row.route}`).sort();
    expect(inTable).toEqual(apiRouteMethods().sort());
  });

  it('names no route and method twice', () => {
    const keys = ROWS.map((row) => `${row.method} ${row.route}`);
    expect(new Set(keys).size).toBe(keys.length);
  });
});
