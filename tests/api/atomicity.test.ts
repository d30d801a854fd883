// Nothing half-written: a failure in the middle of a change leaves the database as it was. The failure is
// real: a trigger in the server's own SQLite file aborts one statement of the change.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDatabase, type Database } from '@/lib/db/connection';
import { startTestServer, type TestServer } from '../support/server';
import { newNote, newPerson, newStudy, type Person } from './fixtures';

let server: TestServer;
let database: Database;
let owner: Person;

beforeAll(async () => {
  server = await startTestServer();
  database = openDatabase(server.databasePath);
  owner = await newPerson(server, 'owner');
});
afterAll(async () => {
  await database?.sequelize.close();
  await server?.stop();
});

/** Runs `work` while every `event` on `table` fails inside the server's database. */
async function whileFailing<T>(event: string, table: string, work: () => Promise<T>): Promise<T> {
  await database.sequelize.query(
    `CREATE TRIGGER injected_failure ${event} ON ${table} BEGIN SELECT RAISE(ABORT, 'injected failure'); END`,
  );
  try {
    return await work();
  } finally {
    await database.sequelize.query('DROP TRIGGER injected_failure');
  }
}

async function count(table: string): Promise<number> {
  const [rows] = await database.sequelize.query(`SELECT COUNT(*) AS n FROM ${table}`);
  return (rows as { n: number }[])[0].n;
}

async function entryTitles(study: number): Promise<string[]> {
  const entries = (await owner.client.get(`/api/studies/${study}/entries`)).body.entries;
  return entries.map((entry: { title: string; position: number }) => `${entry.position}:${entry.title}`);
}

describe('a change that fails half-way', () => {
  it('creating a study keeps no study without its owner', async () => {
    const studiesBefore = await count('studies');
    const response = await whileFailing('BEFORE INSERT', 'memberships', () =>
      owner.client.post('/api/studies', { title: 'Never stored' }),
    );
    expect(response.status).toBe(500);
    expect(response.body.error).toMatchObject({ code: 'internal', message: expect.stringContaining('not saved') });
    expect(await count('studies')).toBe(studiesBefore);
    expect((await owner.client.get('/api/studies')).text).not.toContain('Never stored');
  });

  it('deleting an entry keeps the entry and every position', async () => {
    const study = await newStudy(owner.client);
    for (const title of ['a', 'b', 'c']) await owner.client.post(`/api/studies/${study}/entries`, { kind: 'note', title, body: '' });
    const middle = (await owner.client.get(`/api/studies/${study}/entries`)).body.entries[1].id;
    const response = await whileFailing('BEFORE UPDATE', 'studies', () =>
      owner.client.delete(`/api/studies/${study}/entries/${middle}`),
    );
    expect(response.status).toBe(500);
    expect(await entryTitles(study)).toEqual(['0:a', '1:b', '2:c']);
  });

  it('moving an entry keeps the old order and content', async () => {
    const study = await newStudy(owner.client);
    for (const title of ['a', 'b']) await owner.client.post(`/api/studies/${study}/entries`, { kind: 'note', title, body: '' });
    const last = (await owner.client.get(`/api/studies/${study}/entries`)).body.entries[1].id;
    const response = await whileFailing('BEFORE UPDATE', 'studies', () =>
      owner.client.patch(`/api/studies/${study}/entries/${last}`, { title: 'moved', position: 0 }),
    );
    expect(response.status).toBe(500);
    expect(await entryTitles(study)).toEqual(['0:a', '1:b']);
  });

  it('adding a member leaves no membership when the rest fails', async () => {
    const study = await newStudy(owner.client);
    await newNote(owner.client, study);
    const invited = await newPerson(server, 'invited');
    const response = await whileFailing('BEFORE UPDATE', 'studies', () =>
      owner.client.post(`/api/studies/${study}/members`, { email: invited.email, role: 'viewer' }),
    );
    expect(response.status).toBe(500);
    expect((await invited.client.get(`/api/studies/${study}`)).status).toBe(404);
  });
});
