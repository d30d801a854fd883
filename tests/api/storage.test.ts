// What every start does to storage/: secret, migrations, demo data once, and the SQLite settings. In-process,
// on real SQLite files in temporary folders.
import { mkdirSync, mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { Op, QueryTypes } from 'sequelize';
import { afterEach, describe, expect, it } from 'vitest';
import { readConfig } from '@/lib/config/environment';
import { openDatabase } from '@/lib/db/connection';
import { DEMO_CREDENTIALS_FILE } from '@/lib/demo/seed';
import { schemaMigrations } from '@/models/migrations';
import { prepareStorage } from '@/scripts/prepare-storage';

const folders: string[] = [];
afterEach(() => {
  for (const folder of folders.splice(0)) rmSync(folder, { recursive: true, force: true });
});

function freshConfig() {
  const storageDir = mkdtempSync(path.join(os.tmpdir(), 'splitfield-storage-'));
  folders.push(storageDir);
  return readConfig({ SPLITFIELD_STORAGE: storageDir });
}

async function withDatabase<T>(file: string, work: (database: ReturnType<typeof openDatabase>) => Promise<T>) {
  const database = openDatabase(file);
  try {
    return await work(database);
  } finally {
    await database.sequelize.close();
  }
}

describe('preparing storage', () => {
  it('migrates, seeds once and keeps the same secret across starts', async () => {
    const config = freshConfig();
    const first = await prepareStorage(config, {});
    expect(first.appliedMigrations).toEqual(schemaMigrations.map((migration) => migration.name));
    expect(first.demoAccounts?.map((account) => account.siteRole).sort()).toEqual(['admin', 'member', 'member']);
    expect(new Set(first.demoAccounts?.map((account) => account.studyRole)).size).toBe(3);

    const credentials = path.join(config.storageDir, DEMO_CREDENTIALS_FILE);
    const text = readFileSync(credentials, 'utf8');
    for (const account of first.demoAccounts ?? []) expect(text).toContain(`${account.email}`);
    for (const account of first.demoAccounts ?? []) expect(text).toContain(account.password);
    expect(statSync(credentials).mode & 0o077).toBe(0);
    expect(statSync(path.join(config.storageDir, 'nextauth-secret')).mode & 0o077).toBe(0);

    const second = await prepareStorage(config, {});
    expect(second).toEqual({ secret: first.secret, appliedMigrations: [], demoAccounts: null });
    await withDatabase(config.databasePath, async ({ models }) => {
      expect(await models.User.count()).toBe(3);
      expect(await models.Study.count()).toBe(1);
      expect(await models.Entry.count({ where: { kind: 'note' } })).toBeGreaterThanOrEqual(2);
    });
  });

  it('uses the secret from the environment without writing one', async () => {
    const config = freshConfig();
    const prepared = await prepareStorage(config, { NEXTAUTH_SECRET: 'from-the-environment' });
    expect(prepared.secret).toBe('from-the-environment');
    expect(() => statSync(path.join(config.storageDir, 'nextauth-secret'))).toThrow();
  });

  it('seeds all or nothing: no accounts when the credentials cannot be written, then seeds on the next start', async () => {
    const config = freshConfig();
    const blocker = path.join(config.storageDir, DEMO_CREDENTIALS_FILE);
    mkdirSync(blocker);
    await expect(prepareStorage(config, {})).rejects.toThrow(/EISDIR/);
    await withDatabase(config.databasePath, async ({ models }) => {
      expect(await models.User.count()).toBe(0);
      expect(await models.Study.count()).toBe(0);
    });
    rmSync(blocker, { recursive: true });
    expect((await prepareStorage(config, {})).demoAccounts).toHaveLength(3);
  });
});

describe('SQLite connections', () => {
  it('run in WAL mode with foreign keys and a busy timeout', async () => {
    const config = freshConfig();
    await prepareStorage(config, {});
    await withDatabase(config.databasePath, async ({ sequelize }) => {
      const pragma = async (name: string) => {
        const [row] = await sequelize.query<Record<string, unknown>>(`PRAGMA ${name}`, { type: QueryTypes.SELECT });
        return Object.values(row)[0];
      };
      expect(await pragma('journal_mode')).toBe('wal');
      expect(await pragma('foreign_keys')).toBe(1);
      expect(await pragma('busy_timeout')).toBe(5000);
    });
  });

  it('let two processes’ worth of writers write at once without "database is locked"', async () => {
    const config = freshConfig();
    await prepareStorage(config, {});
    // Two connections stand for two processes (a server and a worker) sharing the file.
    const [one, two] = [openDatabase(config.databasePath), openDatabase(config.databasePath)];
    try {
      const writes = Array.from({ length: 20 }, (_, i) => {
        const { write, models } = i % 2 === 0 ? one : two;
        return write(async (transaction) => {
          const study = await models.Study.create({ title: `Concurrent ${i}` }, { transaction });
          await models.Membership.create({ studyId: study.id, userId: 1, role: 'owner' }, { transaction });
        });
      });
      await Promise.all(writes);
      expect(await one.models.Study.count({ where: { title: { [Op.like]: 'Concurrent%' } } })).toBe(20);
    } finally {
      await Promise.all([one.sequelize.close(), two.sequelize.close()]);
    }
  });

  it('refuses a membership of a study that does not exist', async () => {
    const config = freshConfig();
    await prepareStorage(config, {});
    await withDatabase(config.databasePath, async ({ models }) => {
      await expect(models.Membership.create({ studyId: 999, userId: 1, role: 'viewer' })).rejects.toThrow(/FOREIGN KEY/);
    });
  });
});
