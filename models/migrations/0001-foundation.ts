import { DataTypes } from 'sequelize';
import { SITE_SETTINGS_ID } from '../site-setting';
import { id, reference, timestamps } from './column-helpers';
import type { SchemaMigration } from './types';

/** Users, site settings, studies with their members and entries. */
export const foundation: SchemaMigration = {
  name: '0001-foundation',
  async up(queryInterface, transaction) {
    await queryInterface.createTable(
      'users',
      {
        id,
        email: { type: DataTypes.STRING, allowNull: false, unique: true },
        name: { type: DataTypes.STRING, allowNull: false },
        password_hash: { type: DataTypes.STRING, allowNull: false },
        site_role: { type: DataTypes.STRING, allowNull: false, defaultValue: 'member' },
        disabled: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        session_version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.createTable(
      'site_settings',
      {
        id: { type: DataTypes.INTEGER, primaryKey: true },
        open_signup: { type: DataTypes.BOOLEAN, allowNull: false },
        ...timestamps,
      },
      { transaction },
    );
    const now = new Date();
    await queryInterface.bulkInsert(
      'site_settings',
      [{ id: SITE_SETTINGS_ID, open_signup: true, created_at: now, updated_at: now }],
      { transaction },
    );
    await queryInterface.createTable(
      'studies',
      {
        id,
        title: { type: DataTypes.STRING, allowNull: false },
        description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.createTable(
      'memberships',
      {
        id,
        study_id: { type: DataTypes.INTEGER, allowNull: false, ...reference('studies', 'CASCADE') },
        user_id: { type: DataTypes.INTEGER, allowNull: false, ...reference('users', 'CASCADE') },
        role: { type: DataTypes.STRING, allowNull: false },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.addIndex('memberships', ['study_id', 'user_id'], { unique: true, transaction });
    await queryInterface.addIndex('memberships', ['user_id'], { transaction });
    await queryInterface.createTable(
      'entries',
      {
        id,
        study_id: { type: DataTypes.INTEGER, allowNull: false, ...reference('studies', 'CASCADE') },
        kind: { type: DataTypes.STRING, allowNull: false },
        position: { type: DataTypes.INTEGER, allowNull: false },
        title: { type: DataTypes.STRING, allowNull: false, defaultValue: '' },
        body: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        settings: { type: DataTypes.JSON, allowNull: false, defaultValue: '{}' },
        created_by_id: { type: DataTypes.INTEGER, allowNull: true, ...reference('users', 'SET NULL') },
        updated_by_id: { type: DataTypes.INTEGER, allowNull: true, ...reference('users', 'SET NULL') },
        ...timestamps,
      },
      { transaction },
    );
    // Not unique: reordering moves several rows through the same positions within one transaction.
    await queryInterface.addIndex('entries', ['study_id', 'position'], { transaction });
  },
  async down(queryInterface, transaction) {
    for (const table of ['entries', 'memberships', 'studies', 'site_settings', 'users']) {
      await queryInterface.dropTable(table, { transaction });
    }
  },
};
