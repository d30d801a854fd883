import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { NonAttribute, Sequelize } from 'sequelize';
import { idColumn, tableOptions, timestampColumns } from './columns';
import type { User } from './user';

export function defineTagger(sequelize: Sequelize) {
  /** A saved tagger of a study; `definition` is its JSON document (the file it exports as). */
  class Tagger extends Model<InferAttributes<Tagger>, InferCreationAttributes<Tagger>> {
    declare id: CreationOptional<number>;
    declare studyId: number;
    declare sourceEntryId: number | null;
    declare name: string;
    declare definition: string;
    declare createdById: number | null;
    declare createdAt: CreationOptional<Date>;
    declare updatedAt: CreationOptional<Date>;
    declare createdBy?: NonAttribute<User | null>;
  }
  return Tagger.init(
    {
      ...idColumn,
      studyId: { type: DataTypes.INTEGER, allowNull: false },
      sourceEntryId: { type: DataTypes.INTEGER, allowNull: true },
      name: { type: DataTypes.STRING, allowNull: false },
      definition: { type: DataTypes.TEXT, allowNull: false },
      createdById: { type: DataTypes.INTEGER, allowNull: true },
      ...timestampColumns,
    },
    tableOptions(sequelize, 'taggers'),
  );
}

export type Tagger = InstanceType<ReturnType<typeof defineTagger>>;
