import { DataTypes } from 'sequelize';
import type { SchemaMigration } from './types';

/**
 * A job's processing time measured with a monotonic clock: the difference of two wall-clock dates (started_at,
 * finished_at) is wrong whenever the machine's clock is adjusted during a job.
 */
export const processingTime: SchemaMigration = {
  name: '0003-processing-time',
  async up(queryInterface, transaction) {
    await queryInterface.addColumn('samples', 'processing_ms', { type: DataTypes.INTEGER, allowNull: true }, { transaction });
  },
  async down(queryInterface, transaction) {
    await queryInterface.removeColumn('samples', 'processing_ms', { transaction });
  },
};
