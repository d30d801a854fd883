import { SequelizeStorage, Umzug } from 'umzug';
import type { Sequelize } from 'sequelize';
import { schemaMigrations } from './migrations';

function migrator(sequelize: Sequelize) {
  const queryInterface = sequelize.getQueryInterface();
  return new Umzug({
    migrations: schemaMigrations.map((migration) => ({
      name: migration.name,
      up: () => sequelize.transaction((transaction) => migration.up(queryInterface, transaction)),
      down: () => sequelize.transaction((transaction) => migration.down(queryInterface, transaction)),
    })),
    context: queryInterface,
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  });
}

/** Applies the schema steps not yet applied; returns their names. */
export async function migrateUp(sequelize: Sequelize): Promise<string[]> {
  const applied = await migrator(sequelize).up();
  return applied.map((migration) => migration.name);
}
