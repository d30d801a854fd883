import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { NonAttribute, Sequelize } from 'sequelize';
import type { SampleCounts, SampleError, SampleInput, SampleProgress, SampleSettings } from './sample-fields';
import { idColumn, tableOptions, timestampColumns } from './columns';
import type { Study } from './study';
import type { User } from './user';
import { SAMPLE_STATES, type SampleState } from './vocabulary';

export function defineSample(sequelize: Sequelize) {
  /**
   * One uploaded file and what processing made of it. Its binary tables live under storage/samples/<id>/ only
   * while the state is 'done'; a failed sample keeps this row as the record of the failure, and nothing else.
   */
  class Sample extends Model<InferAttributes<Sample>, InferCreationAttributes<Sample>> {
    declare id: CreationOptional<number>;
    declare studyId: number;
    declare uploadedById: number | null;
    declare name: string;
    declare label: CreationOptional<string>;
    declare description: CreationOptional<string>;
    declare tags: CreationOptional<string[]>;
    declare state: SampleState;
    declare progress: CreationOptional<SampleProgress | null>;
    declare counts: CreationOptional<SampleCounts | null>;
    declare error: CreationOptional<SampleError | null>;
    declare settings: SampleSettings;
    /** The settings in a canonical text form: same file hash and same key = the same sample. */
    declare settingsKey: string;
    declare fileName: string;
    declare fileSize: number;
    /** SHA-256 of the uploaded bytes, hex. */
    declare fileHash: string;
    /** Time spent receiving the upload. */
    declare uploadMs: CreationOptional<number>;
    /** The uploaded file's name under storage/uploads/ while it waits for (or is in) processing; null after. */
    declare uploadFile: string | null;
    /** How many times a job started on it; a job cut short by a server stop is tried once more, not forever. */
    declare attempts: CreationOptional<number>;
    declare input: CreationOptional<SampleInput | null>;
    /** Version of the software that processed the file. */
    declare softwareVersion: CreationOptional<string | null>;
    declare startedAt: CreationOptional<Date | null>;
    declare finishedAt: CreationOptional<Date | null>;
    /** Time from the job's start to its end on a monotonic clock (null until it ends). */
    declare processingMs: CreationOptional<number | null>;
    /**
     * The sample whose folder under storage/samples/ holds this sample's tables, when it shares them (the same
     * file processed with the same settings, attached to another study); null when the folder is its own.
     */
    declare tablesId: CreationOptional<number | null>;
    declare createdAt: CreationOptional<Date>;
    declare updatedAt: CreationOptional<Date>;
    declare study?: NonAttribute<Study>;
    declare uploadedBy?: NonAttribute<User | null>;
  }
  return Sample.init(
    {
      ...idColumn,
      studyId: { type: DataTypes.INTEGER, allowNull: false },
      uploadedById: { type: DataTypes.INTEGER, allowNull: true },
      name: { type: DataTypes.STRING, allowNull: false },
      label: { type: DataTypes.STRING, allowNull: false, defaultValue: '' },
      description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      tags: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
      state: { type: DataTypes.STRING, allowNull: false, validate: { isIn: [[...SAMPLE_STATES]] } },
      progress: { type: DataTypes.JSON, allowNull: true },
      counts: { type: DataTypes.JSON, allowNull: true },
      error: { type: DataTypes.JSON, allowNull: true },
      settings: { type: DataTypes.JSON, allowNull: false },
      settingsKey: { type: DataTypes.STRING, allowNull: false },
      fileName: { type: DataTypes.STRING, allowNull: false },
      fileSize: { type: DataTypes.BIGINT, allowNull: false },
      fileHash: { type: DataTypes.STRING, allowNull: false },
      uploadMs: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      uploadFile: { type: DataTypes.STRING, allowNull: true },
      attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      input: { type: DataTypes.JSON, allowNull: true },
      softwareVersion: { type: DataTypes.STRING, allowNull: true },
      startedAt: { type: DataTypes.DATE, allowNull: true },
      finishedAt: { type: DataTypes.DATE, allowNull: true },
      processingMs: { type: DataTypes.INTEGER, allowNull: true },
      tablesId: { type: DataTypes.INTEGER, allowNull: true },
      ...timestampColumns,
    },
    tableOptions(sequelize, 'samples'),
  );
}

export type Sample = InstanceType<ReturnType<typeof defineSample>>;
