import { randomBytes } from 'node:crypto';
import { writeFileSync } from 'node:fs';
import path from 'node:path';
import { DEMO_SAMPLE_JETS, seedDemoSamples } from '@/lib/demo/samples';
import type { SiteRole, StudyRole } from '@/models/vocabulary';
import { hashPassword } from '../auth/password';
import type { Database } from '../db/connection';
import { demoSeparationEntry, demoViewEntries } from './study-views';
import { DEMO_CLOSING_NOTE, DEMO_NOTES, DEMO_REGION_CATEGORIES, DEMO_STUDY } from './study-text';

export interface DemoAccount {
  name: string;
  email: string;
  password: string;
  siteRole: SiteRole;
  /** The account's role in the demo study. */
  studyRole: StudyRole;
}

export const DEMO_CREDENTIALS_FILE = 'DEMO-CREDENTIALS.txt';

// Fictional people of the fictional Larkspur jet group.
const DEMO_PEOPLE: Omit<DemoAccount, 'password'>[] = [
  { name: 'Ines Marrow', email: 'admin@larkspur.test', siteRole: 'admin', studyRole: 'editor' },
  { name: 'Tamsin Quell', email: 'tamsin@larkspur.test', siteRole: 'member', studyRole: 'owner' },
  { name: 'Oren Halvik', email: 'oren@larkspur.test', siteRole: 'member', studyRole: 'commenter' },
];

export function demoCredentialsText(accounts: DemoAccount[]): string {
  const lines = accounts.map(
    (account) => `${account.siteRole.padEnd(7)} ${account.email.padEnd(24)} ${account.password}  (${account.name})`,
  );
  return [
    'Splitfield demo accounts, made on first start. Change these passwords after signing in.',
    ...lines,
    '',
  ].join('\n');
}

/**
 * On an empty database (no users yet), creates the demo accounts with random passwords, the demo study with its
 * notes and its two generated samples (queued for processing), and writes the credentials to storage/; all or
 * nothing. Returns the accounts, or null when the database already had users, so it runs once however often the
 * server starts.
 */
export async function seedOnce(database: Database, storageDir: string, demoJets = DEMO_SAMPLE_JETS): Promise<DemoAccount[] | null> {
  const { models, write } = database;
  return write(async (transaction) => {
    if ((await models.User.count({ transaction })) > 0) return null;
    const accounts = DEMO_PEOPLE.map((person) => ({ ...person, password: randomBytes(12).toString('base64url') }));
    const study = await models.Study.create(DEMO_STUDY, { transaction });
    const users = [];
    for (const { name, email, siteRole, studyRole, password } of accounts) {
      const passwordHash = await hashPassword(password);
      const user = await models.User.create({ name, email, siteRole, passwordHash }, { transaction });
      await models.Membership.create({ studyId: study.id, userId: user.id, role: studyRole }, { transaction });
      users.push(user);
    }
    const author = users[accounts.findIndex((account) => account.studyRole === 'owner')];
    const demoSamples = { storageDir, studyId: study.id, uploaderId: author.id, jets: demoJets };
    const { ids, removeFiles: removeSampleFiles } = await seedDemoSamples(models, transaction, demoSamples);
    // Notes first, then a Map of each sample and their Contrast, then what the contrast shows, then a Separation.
    const entries = [
      ...DEMO_NOTES.map((note) => ({ kind: 'note' as const, ...note, settings: {} })),
      ...demoViewEntries(ids),
      { kind: 'note' as const, ...DEMO_CLOSING_NOTE, settings: {} },
      demoSeparationEntry(ids),
    ];
    for (const [position, entry] of entries.entries()) {
      await models.Entry.create({ studyId: study.id, position, ...entry, createdById: author.id, updatedById: author.id }, { transaction });
    }
    await models.RegionCategory.bulkCreate(DEMO_REGION_CATEGORIES.map((category) => ({ studyId: study.id, ...category })), { transaction });
    // Written before the commit: if it fails, the transaction rolls back and the next start tries again.
    try {
      writeFileSync(path.join(storageDir, DEMO_CREDENTIALS_FILE), demoCredentialsText(accounts), { mode: 0o600 });
    } catch (error) {
      await removeSampleFiles();
      throw error;
    }
    return accounts;
  });
}
