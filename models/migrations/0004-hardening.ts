import { DataTypes } from 'sequelize';
import { id, reference, timestamps } from './column-helpers';
import type { SchemaMigration } from './types';

/**
 * Sessions kept on the server (a sign-out, a password change or "sign out everywhere" ends them for good), and
 * samples that share the stored tables of another sample of the same file and settings (`tables_id`: the sample
 * whose folder under storage/samples/ holds them; null for a sample's own).
 */
export const hardening: SchemaMigration = {
  name: '0004-hardening',
  async up(queryInterface, transaction) {
    await queryInterface.createTable(
      'sessions',
      {
        id,
        key: { type: DataTypes.STRING, allowNull: false, unique: true },
        user_id: { type: DataTypes.INTEGER, allowNull: false, ...reference('users', 'CASCADE') },
        expires_at: { type: DataTypes.DATE, allowNull: false },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.addIndex('sessions', ['user_id'], { transaction });
    await queryInterface.addColumn('samples', 'tables_id', { type: DataTypes.INTEGER, allowNull: true }, { transaction });
    await queryInterface.addIndex('samples', ['tables_id'], { transaction });
  },
  async down(queryInterface, transaction) {
    await queryInterface.removeIndex('samples', ['tables_id'], { transaction });
    await queryInterface.removeColumn('samples', 'tables_id', { transaction });
    await queryInterface.dropTable('sessions', { transaction });
  },
};
