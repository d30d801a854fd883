// What every start does before the web server runs (npm start and the test harness alike):
// storage folder, session secret, schema migrations, the demo data on the very first start, and private modes
// (folders 0700, files 0600) on everything in storage.
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { ensureAuthSecret } from '../lib/auth/secret';
import type { Environment, ServerConfig } from '../lib/config/environment';
import { makeStoragePrivate } from '../lib/config/private-files';
import { openDatabase } from '../lib/db/connection';
import { demoSampleJets } from '../lib/demo/samples';
import { seedOnce, type DemoAccount } from '../lib/demo/seed';
import { migrateUp } from '../models/migrate';

export interface PreparedStorage {
  secret: string;
  appliedMigrations: string[];
  /** The demo accounts when this start created them; null on every later start. */
  demoAccounts: DemoAccount[] | null;
}

export async function prepareStorage(
  config: ServerConfig,
  env: Environment = process.env,
): Promise<PreparedStorage> {
  mkdirSync(config.storageDir, { recursive: true });
  mkdirSync(path.dirname(config.databasePath), { recursive: true });
  const secret = ensureAuthSecret(config.storageDir, env);
  const database = openDatabase(config.databasePath);
  try {
    const appliedMigrations = await migrateUp(database.sequelize);
    const demoAccounts = await seedOnce(database, config.storageDir, demoSampleJets(env));
    return { secret, appliedMigrations, demoAccounts };
  } finally {
    await database.sequelize.close();
    makeStoragePrivate(config.storageDir, config.databasePath);
  }
}
