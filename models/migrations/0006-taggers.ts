import { DataTypes } from 'sequelize';
import { id, reference, timestamps } from './column-helpers';
import type { SchemaMigration } from './types';

/**
 * Taggers: a Separation saved for reuse (binning, jet selection, the ln-ratio table, the working points and the
 * training samples' file hashes), kept as one self-describing JSON document (lib/separations/tagger-document.ts),
 * owned by a study. `source_entry_id` names the Separation it was saved from (null for an imported file or when
 * that entry is deleted).
 */
export const taggers: SchemaMigration = {
  name: '0006-taggers',
  async up(queryInterface, transaction) {
    await queryInterface.createTable(
      'taggers',
      {
        id,
        study_id: { type: DataTypes.INTEGER, allowNull: false, ...reference('studies', 'CASCADE') },
        source_entry_id: { type: DataTypes.INTEGER, allowNull: true, ...reference('entries', 'SET NULL') },
        name: { type: DataTypes.STRING, allowNull: false },
        definition: { type: DataTypes.TEXT, allowNull: false },
        created_by_id: { type: DataTypes.INTEGER, allowNull: true, ...reference('users', 'SET NULL') },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.addIndex('taggers', ['study_id'], { transaction });
  },
  async down(queryInterface, transaction) {
    await queryInterface.dropTable('taggers', { transaction });
  },
};
