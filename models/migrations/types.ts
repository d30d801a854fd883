import type { QueryInterface, Transaction } from 'sequelize';

/** One schema step. `up` and `down` run inside a transaction that the runner opens and commits. */
export interface SchemaMigration {
  name: string;
  up(queryInterface: QueryInterface, transaction: Transaction): Promise<void>;
  down(queryInterface: QueryInterface, transaction: Transaction): Promise<void>;
}
