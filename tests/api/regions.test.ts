// Regions, threads, mentions and the activity feed through the API on a real server: what is stored, who is told,
// bad input, hidden studies and a burst of comments.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDatabase } from '@/lib/db/connection';
import type { TestServer } from '../support/server';
import { addMember, newNote, newPerson, newStudy, serverWithAdmin, type Person } from './fixtures';

// Enough for the commenter of these tests in one minute; the burst goes past it.
const COMMENT_LIMIT = 25;
let server: TestServer;
let owner: Person, commenter: Person, viewer: Person, outsider: Person;
let studyId: number;

const axes = { x: 'lnInvDelta', y: 'lnKt' };
const rectangle = { axes, shape: { type: 'rectangle', x1: 1, x2: 3, y1: -1, y2: 1 } };
const regions = (rest = '') => `/api/studies/${studyId}/regions${rest}`;

beforeAll(async () => {
  ({ server } = await serverWithAdmin({ env: { SPLITFIELD_COMMENTS_PER_MINUTE: String(COMMENT_LIMIT) } }));
  [owner, commenter, viewer, outsider] = await Promise.all(['owner', 'commenter', 'viewer', 'outsider'].map((label) => newPerson(server, label)));
  studyId = await newStudy(owner.client, 'Regions study');
  await addMember(owner.client, studyId, commenter.email, 'commenter');
  await addMember(owner.client, studyId, viewer.email, 'viewer');
});
afterAll(() => server?.stop());

async function notifications(): Promise<Array<{ user_id: number; kind: string; actor_id: number; summary: string; link: string }>> {
  const database = openDatabase(server.databasePath);
  try {
    const [rows] = await database.sequelize.query('SELECT user_id, kind, actor_id, summary, link FROM notifications ORDER BY id');
    return rows as Array<{ user_id: number; kind: string; actor_id: number; summary: string; link: string }>;
  } finally {
    await database.sequelize.close();
  }
}

describe('regions and their threads', () => {
  it('stores a polygon region with its category and first comment, and resolves and reopens it', async () => {
    const category = await owner.client.post(`/api/studies/${studyId}/region-categories`, { name: 'Excess', colour: '#CC6677' });
    expect(category.status, category.text).toBe(201);
    expect(category.body.category).toMatchObject({ name: 'Excess', colour: '#cc6677' });
    const points = [[0.5, 0], [3, 0.2], [2, 1.5], [1, 1]];
    const made = await commenter.client.post(regions(), { title: 'Wide-angle excess', categoryId: category.body.category.id, comment: 'More emissions here than in the quark sample.', geometry: { axes, shape: { type: 'polygon', points } } });
    expect(made.status, made.text).toBe(201);
    expect(made.body.region).toMatchObject({ title: 'Wide-angle excess', state: 'open', category: { name: 'Excess' }, createdBy: { id: commenter.id }, commentCount: 1 });
    expect(made.body.region.geometry).toEqual({ axes, shape: { type: 'polygon', points } });

    const path = regions(`/${made.body.region.id}`);
    const read = await viewer.client.get(path);
    expect(read.body.comments.map((c: { body: string }) => c.body)).toEqual(['More emissions here than in the quark sample.']);
    const resolved = await owner.client.patch(path, { state: 'resolved' });
    expect(resolved.body.region).toMatchObject({ state: 'resolved', stateChangedBy: { id: owner.id } });
    const reopened = await commenter.client.patch(path, { state: 'open' });
    expect(reopened.body.region).toMatchObject({ state: 'open', stateChangedBy: { id: commenter.id } });
    // The viewer reads but may not change the state.
    expect((await viewer.client.patch(path, { state: 'resolved' })).status).toBe(403);
  });

  it('keeps script and HTML in titles, categories and comments as the text that was typed', async () => {
    const html = '<script>alert(1)</script><img src=x onerror=alert(2)>';
    const category = await owner.client.post(`/api/studies/${studyId}/region-categories`, { name: `<b>${html}</b>`.slice(0, 60), colour: '#117733' });
    expect(category.status, category.text).toBe(201);
    expect(category.body.category.name).toBe(`<b>${html}</b>`.slice(0, 60));
    const made = await commenter.client.post(regions(), { title: html, comment: `**bold** ${html}`, geometry: rectangle });
    expect(made.status, made.text).toBe(201);
    const read = await owner.client.get(regions(`/${made.body.region.id}`));
    expect(read.body.region.title).toBe(html);
    expect(read.body.comments[0].body).toBe(`**bold** ${html}`);
    expect(read.headers.get('content-type')).toMatch(/^application\/json/);
  });

  it('refuses bad polygons, bad colours, unknown fields and a category of another study, naming the place', async () => {
    const bad = async (body: unknown) => {
      const answer = await commenter.client.post(regions(), body);
      expect(answer.status, answer.text).toBe(400);
      return answer.body.error.details.map((d: { path: string; message: string }) => `${d.path}: ${d.message}`);
    };
    const polygon = (points: unknown) => ({ title: 'Bad', comment: 'x', geometry: { axes, shape: { type: 'polygon', points } } });
    expect(await bad(polygon([[0, 0], [1, 1]]))).toEqual(['geometry.shape.points: A polygon needs at least 3 points']);
    expect(await bad(polygon([[0, 0], [2, 2], [2, 0], [0, 2]]))).toEqual(['geometry.shape.points: The polygon crosses itself: edge 0 meets edge 2']);
    // JSON has no Infinity or NaN: they arrive as null, or as huge numbers that overflow to Infinity.
    expect(await bad(polygon([[0, 0], [1, null], [0, 1]]))).toEqual(['geometry.shape.points.1.1: y must be a finite number']);
    const overflow = await commenter.client.send('POST', regions(), { rawBody: '{"title":"Bad","comment":"x","geometry":{"axes":{"x":"lnInvDelta","y":"lnKt"},"shape":{"type":"rectangle","x1":0,"x2":1e999,"y1":0,"y2":1}}}' });
    expect(overflow.status).toBe(400);
    expect(overflow.body.error.details[0].path).toBe('geometry.shape.x2');
    expect(await bad({ title: '  ', comment: 'x', geometry: rectangle })).toEqual(['title: Title must not be empty']);
    expect(await bad({ title: 'No words', comment: '   ', geometry: rectangle })).toEqual(['comment: Comment must not be empty']);
    expect((await bad({ title: 'Extra', comment: 'x', geometry: rectangle, colour: 'red' }))[0]).toMatch(/colour/);
    const colour = await owner.client.post(`/api/studies/${studyId}/region-categories`, { name: 'Red', colour: 'red' });
    expect(colour.body.error.details).toEqual([{ path: 'colour', message: 'Colour must be #rrggbb (six hexadecimal digits)' }]);

    const elsewhere = await newStudy(outsider.client, 'Elsewhere');
    const foreign = await outsider.client.post(`/api/studies/${elsewhere}/region-categories`, { name: 'Theirs', colour: '#000000' });
    expect(await bad({ title: 'Foreign', comment: 'x', categoryId: foreign.body.category.id, geometry: rectangle })).toEqual([
      `categoryId: No category ${foreign.body.category.id} in this study`,
    ]);
    expect((await owner.client.get(regions())).body.regions.map((r: { title: string }) => r.title)).not.toContain('Foreign');
  });

  it('answers 404 for a region of a study the caller cannot see, and for a region under the wrong study', async () => {
    const made = await commenter.client.post(regions(), { title: 'Private', comment: 'Members only.', geometry: rectangle });
    const id = made.body.region.id;
    for (const answer of [await outsider.client.get(regions(`/${id}`)), await outsider.client.post(regions(`/${id}/comments`), { body: 'Let me in' })]) {
      expect(answer.status).toBe(404);
      expect(answer.body.error.code).toBe('not_found');
    }
    const theirs = await newStudy(outsider.client, 'Their own');
    const crossed = await outsider.client.post(`/api/studies/${theirs}/regions/${id}/comments`, { body: 'Through my own study' });
    expect(crossed.status).toBe(404);
    const thread = (await owner.client.get(regions(`/${id}/comments`))).body.comments;
    expect(thread.map((c: { body: string }) => c.body)).toEqual(['Members only.']);
  });

  it('edits (marked) and deletes one’s own comments, keeps replies in place, and refuses others’', async () => {
    const made = await commenter.client.post(regions(), { title: 'Thread', comment: 'First.', geometry: rectangle });
    const path = regions(`/${made.body.region.id}/comments`);
    const first = (await commenter.client.get(path)).body.comments[0];
    const reply = await owner.client.post(path, { body: 'A reply.', replyToId: first.id });
    expect(reply.body.comment).toMatchObject({ replyToId: first.id, editedAt: null });
    expect((await owner.client.patch(`${path}/${first.id}`, { body: 'Not mine' })).status).toBe(403);
    const edited = await commenter.client.patch(`${path}/${first.id}`, { body: 'First, corrected.' });
    expect(edited.body.comment.body).toBe('First, corrected.');
    expect(edited.body.comment.editedAt).toEqual(expect.any(String));
    expect((await commenter.client.send('DELETE', `${path}/${first.id}`)).status).toBe(204);
    const thread = (await viewer.client.get(path)).body.comments;
    expect(thread.map((c: { deleted: boolean; body: string; replyToId: number | null }) => [c.deleted, c.body, c.replyToId])).toEqual([
      [true, '', null],
      [false, 'A reply.', first.id],
    ]);
    const wrongParent = await owner.client.post(path, { body: 'Orphan', replyToId: 999999 });
    expect(wrongParent.body.error.details).toEqual([{ path: 'replyToId', message: 'No comment 999999 on this region' }]);
  });
});

describe('mentions and replies', () => {
  it('tells mentioned members and the thread’s other participants, and nobody else', async () => {
    const before = (await notifications()).length;
    const made = await commenter.client.post(regions(), { title: 'Ask the owner', comment: 'Started by the commenter.', geometry: rectangle });
    const path = regions(`/${made.body.region.id}/comments`);
    // The owner is mentioned; the outsider is not a member; id 999999 exists nowhere.
    const body = `@[${owner.name}](user:${owner.id}) is this the gluon excess? cc @[Who](user:${outsider.id}) @[Nobody](user:999999)`;
    expect((await commenter.client.post(path, { body })).status).toBe(201);
    let rows = (await notifications()).slice(before);
    expect(rows.map((r) => [r.user_id, r.kind, r.actor_id])).toEqual([[owner.id, 'mention', commenter.id]]);
    expect(rows[0].summary).toBe(`${commenter.name} mentioned you on region “Ask the owner”`);
    expect(rows[0].link).toBe(`/studies/${studyId}?region=${made.body.region.id}#regions`);

    // The owner answers: the commenter (the other participant) hears of a reply; the owner is not told of their own.
    expect((await owner.client.post(path, { body: 'Yes, and it matches 9/4.' })).status).toBe(201);
    rows = (await notifications()).slice(before + 1);
    expect(rows.map((r) => [r.user_id, r.kind])).toEqual([[commenter.id, 'reply']]);
  });

  it('tells the members an edit newly mentions, once, and not those the comment already mentioned', async () => {
    const before = (await notifications()).length;
    const made = await owner.client.post(regions(), { title: 'Edited mention', comment: 'Started.', geometry: rectangle });
    const path = regions(`/${made.body.region.id}/comments`);
    const ownerMention = `@[${owner.name}](user:${owner.id})`;
    const posted = await commenter.client.post(path, { body: `Thanks ${ownerMention}` });
    expect((await notifications()).slice(before).map((r) => [r.user_id, r.kind])).toEqual([[owner.id, 'mention']]);
    const commentPath = `${path}/${posted.body.comment.id}`;
    const added = `Thanks ${ownerMention}, and @[${viewer.name}](user:${viewer.id}) should see this too`;
    expect((await commenter.client.patch(commentPath, { body: added })).status).toBe(200);
    const rows = (await notifications()).slice(before + 1);
    expect(rows.map((r) => [r.user_id, r.kind, r.actor_id])).toEqual([[viewer.id, 'mention', commenter.id]]);
    expect(rows[0].summary).toBe(`${commenter.name} mentioned you on region “Edited mention”`);
    // Editing again with the same mentions tells nobody.
    expect((await commenter.client.patch(commentPath, { body: `${added}.` })).status).toBe(200);
    expect((await notifications()).length).toBe(before + 2);
  });

  it('does not tell whether an address or id outside the study exists: the answer is the same', async () => {
    const made = await commenter.client.post(regions(), { title: 'Probe', comment: 'x', geometry: rectangle });
    const path = regions(`/${made.body.region.id}/comments`);
    const known = await commenter.client.post(path, { body: `@[X](user:${outsider.id})` });
    const unknown = await commenter.client.post(path, { body: '@[X](user:999998)' });
    expect([known.status, unknown.status]).toEqual([201, 201]);
    expect(Object.keys(known.body.comment)).toEqual(Object.keys(unknown.body.comment));
  });
});

describe('a burst of comments', () => {
  it('is refused past the limit with a clear message, and every accepted comment is kept', async () => {
    const burster = await newPerson(server, 'burster');
    await addMember(owner.client, studyId, burster.email, 'commenter');
    const made = await owner.client.post(regions(), { title: 'Busy', comment: 'Go.', geometry: rectangle });
    const path = regions(`/${made.body.region.id}/comments`);
    const answers = await Promise.all(Array.from({ length: COMMENT_LIMIT + 4 }, (_, i) => burster.client.post(path, { body: `Burst ${i}` })));
    const accepted = answers.filter((a) => a.status === 201).map((a) => a.body.comment.body);
    const refused = answers.filter((a) => a.status === 429);
    expect(accepted).toHaveLength(COMMENT_LIMIT);
    expect(refused).toHaveLength(4);
    expect(refused[0].body.error.message).toMatch(/^Too many comments\. Try again in \d+ seconds\.$/);
    expect(Number(refused[0].headers.get('retry-after'))).toBeGreaterThan(0);
    const thread = (await owner.client.get(path)).body.comments.map((c: { body: string }) => c.body);
    expect(thread.slice(1).sort()).toEqual([...accepted].sort());
    // Someone else is not held back by it.
    expect((await commenter.client.post(path, { body: 'Still here.' })).status).toBe(201);
  });
});

describe('activity feed', () => {
  it('lists who added which entry, region and comment, unread for others until they mark it read', async () => {
    const study = await newStudy(owner.client, 'Feed study');
    await addMember(owner.client, study, commenter.email, 'commenter');
    await newNote(owner.client, study, 'Plan of the study.');
    const made = await commenter.client.post(`/api/studies/${study}/regions`, { title: 'Kink', comment: 'See the kink.', geometry: rectangle });
    await owner.client.patch(`/api/studies/${study}/regions/${made.body.region.id}`, { state: 'resolved' });
    const feed = (await owner.client.get(`/api/studies/${study}/activity`)).body;
    const lines = feed.items.map((i: { kind: string; actor: { id: number }; what: string; unread: boolean }) => [i.kind, i.actor.id, i.what, i.unread]);
    expect(lines).toEqual(
      expect.arrayContaining([
        ['entry', owner.id, 'note', false],
        ['region', commenter.id, 'region “Kink”', true],
        ['comment', commenter.id, 'comment on region “Kink”', true],
        ['region-resolved', owner.id, 'region “Kink”', false],
      ]),
    );
    expect(feed.unreadCount).toBe(2);
    expect((await owner.client.post(`/api/studies/${study}/activity`)).status).toBe(204);
    const after = (await owner.client.get(`/api/studies/${study}/activity`)).body;
    expect(after.unreadCount).toBe(0);
    // The commenter has read nothing yet: the owner's note and state change are new to them.
    expect((await commenter.client.get(`/api/studies/${study}/activity`)).body.unreadCount).toBe(2);
  });
});
