import { DataTypes } from 'sequelize';
import { id, reference, timestamps } from './column-helpers';
import type { SchemaMigration } from './types';

/**
 * Regions on a study's planes with their threads: the study's own region categories (a name and a colour), regions
 * (geometry in plane coordinates as JSON, a title, a state), their comments (Markdown, replies, an edit mark, a
 * deletion that keeps the thread's shape), and how far each member has read the study's activity feed.
 */
export const regions: SchemaMigration = {
  name: '0008-regions',
  async up(queryInterface, transaction) {
    await queryInterface.createTable(
      'region_categories',
      {
        id,
        study_id: { type: DataTypes.INTEGER, allowNull: false, ...reference('studies', 'CASCADE') },
        name: { type: DataTypes.STRING, allowNull: false },
        colour: { type: DataTypes.STRING, allowNull: false },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.addIndex('region_categories', ['study_id', 'name'], { unique: true, transaction });
    await queryInterface.createTable(
      'regions',
      {
        id,
        study_id: { type: DataTypes.INTEGER, allowNull: false, ...reference('studies', 'CASCADE') },
        entry_id: { type: DataTypes.INTEGER, allowNull: true, ...reference('entries', 'SET NULL') },
        category_id: { type: DataTypes.INTEGER, allowNull: true, ...reference('region_categories', 'SET NULL') },
        title: { type: DataTypes.STRING, allowNull: false },
        geometry: { type: DataTypes.JSON, allowNull: false },
        state: { type: DataTypes.STRING, allowNull: false, defaultValue: 'open' },
        created_by_id: { type: DataTypes.INTEGER, allowNull: true, ...reference('users', 'SET NULL') },
        state_changed_by_id: { type: DataTypes.INTEGER, allowNull: true, ...reference('users', 'SET NULL') },
        state_changed_at: { type: DataTypes.DATE, allowNull: true },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.addIndex('regions', ['study_id'], { transaction });
    await queryInterface.createTable(
      'region_comments',
      {
        id,
        region_id: { type: DataTypes.INTEGER, allowNull: false, ...reference('regions', 'CASCADE') },
        author_id: { type: DataTypes.INTEGER, allowNull: true, ...reference('users', 'SET NULL') },
        reply_to_id: { type: DataTypes.INTEGER, allowNull: true, ...reference('region_comments', 'SET NULL') },
        body: { type: DataTypes.TEXT, allowNull: false },
        edited_at: { type: DataTypes.DATE, allowNull: true },
        deleted_at: { type: DataTypes.DATE, allowNull: true },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.addIndex('region_comments', ['region_id'], { transaction });
    await queryInterface.createTable(
      'activity_reads',
      {
        id,
        study_id: { type: DataTypes.INTEGER, allowNull: false, ...reference('studies', 'CASCADE') },
        user_id: { type: DataTypes.INTEGER, allowNull: false, ...reference('users', 'CASCADE') },
        seen_at: { type: DataTypes.DATE, allowNull: false },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.addIndex('activity_reads', ['study_id', 'user_id'], { unique: true, transaction });
  },
  async down(queryInterface, transaction) {
    await queryInterface.dropTable('activity_reads', { transaction });
    await queryInterface.dropTable('region_comments', { transaction });
    await queryInterface.dropTable('regions', { transaction });
    await queryInterface.dropTable('region_categories', { transaction });
  },
};
