import { DataTypes } from 'sequelize';
import { id, reference, timestamps } from './column-helpers';
import type { SchemaMigration } from './types';

/** Uploaded samples with their processing state and provenance, their cached planes, and personal API tokens. */
export const samples: SchemaMigration = {
  name: '0002-samples',
  async up(queryInterface, transaction) {
    await queryInterface.createTable(
      'samples',
      {
        id,
        study_id: { type: DataTypes.INTEGER, allowNull: false, ...reference('studies', 'CASCADE') },
        uploaded_by_id: { type: DataTypes.INTEGER, allowNull: true, ...reference('users', 'SET NULL') },
        name: { type: DataTypes.STRING, allowNull: false },
        label: { type: DataTypes.STRING, allowNull: false, defaultValue: '' },
        description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        tags: { type: DataTypes.JSON, allowNull: false, defaultValue: '[]' },
        state: { type: DataTypes.STRING, allowNull: false },
        progress: { type: DataTypes.JSON, allowNull: true },
        counts: { type: DataTypes.JSON, allowNull: true },
        error: { type: DataTypes.JSON, allowNull: true },
        settings: { type: DataTypes.JSON, allowNull: false },
        settings_key: { type: DataTypes.STRING, allowNull: false },
        file_name: { type: DataTypes.STRING, allowNull: false },
        file_size: { type: DataTypes.BIGINT, allowNull: false },
        file_hash: { type: DataTypes.STRING, allowNull: false },
        upload_ms: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        upload_file: { type: DataTypes.STRING, allowNull: true },
        attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        input: { type: DataTypes.JSON, allowNull: true },
        software_version: { type: DataTypes.STRING, allowNull: true },
        started_at: { type: DataTypes.DATE, allowNull: true },
        finished_at: { type: DataTypes.DATE, allowNull: true },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.addIndex('samples', ['study_id'], { transaction });
    await queryInterface.addIndex('samples', ['file_hash'], { transaction });
    await queryInterface.addIndex('samples', ['state'], { transaction });
    await queryInterface.createTable(
      'sample_planes',
      {
        id,
        sample_id: { type: DataTypes.INTEGER, allowNull: false, ...reference('samples', 'CASCADE') },
        horizontal: { type: DataTypes.STRING, allowNull: false },
        histogram: { type: DataTypes.BLOB, allowNull: false },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.addIndex('sample_planes', ['sample_id', 'horizontal'], { unique: true, transaction });
    await queryInterface.createTable(
      'api_tokens',
      {
        id,
        user_id: { type: DataTypes.INTEGER, allowNull: false, ...reference('users', 'CASCADE') },
        name: { type: DataTypes.STRING, allowNull: false },
        prefix: { type: DataTypes.STRING, allowNull: false },
        secret_hash: { type: DataTypes.STRING, allowNull: false, unique: true },
        last_used_at: { type: DataTypes.DATE, allowNull: true },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.addIndex('api_tokens', ['user_id'], { transaction });
  },
  async down(queryInterface, transaction) {
    for (const table of ['api_tokens', 'sample_planes', 'samples']) {
      await queryInterface.dropTable(table, { transaction });
    }
  },
};
