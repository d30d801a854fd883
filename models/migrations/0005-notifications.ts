import { DataTypes } from 'sequelize';
import { id, reference, timestamps } from './column-helpers';
import type { SchemaMigration } from './types';

/**
 * Notifications: one row per person to tell about one event (a mention, a reply, a sample finished or failed).
 * The producer only records the row; delivery (a mail now, a digest line later, or nothing) is decided from the
 * person's choices when it is sent, and `mailed_at` marks a row as dealt with.
 */
export const notifications: SchemaMigration = {
  name: '0005-notifications',
  async up(queryInterface, transaction) {
    await queryInterface.createTable(
      'notifications',
      {
        id,
        user_id: { type: DataTypes.INTEGER, allowNull: false, ...reference('users', 'CASCADE') },
        kind: { type: DataTypes.STRING, allowNull: false },
        study_id: { type: DataTypes.INTEGER, allowNull: true, ...reference('studies', 'CASCADE') },
        actor_id: { type: DataTypes.INTEGER, allowNull: true, ...reference('users', 'SET NULL') },
        summary: { type: DataTypes.TEXT, allowNull: false },
        link: { type: DataTypes.STRING, allowNull: false },
        mailed_at: { type: DataTypes.DATE, allowNull: true },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.addIndex('notifications', ['user_id', 'mailed_at'], { transaction });
  },
  async down(queryInterface, transaction) {
    await queryInterface.dropTable('notifications', { transaction });
  },
};
