import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { NonAttribute, Sequelize } from 'sequelize';
import { idColumn, tableOptions, timestampColumns } from './columns';
import type { User } from './user';
import { ENTRY_KINDS, type EntryKind } from './vocabulary';

export function defineEntry(sequelize: Sequelize) {
  /** One item of a study's ordered list; `position` counts from 0 without gaps. */
  class Entry extends Model<InferAttributes<Entry>, InferCreationAttributes<Entry>> {
    declare id: CreationOptional<number>;
    declare studyId: number;
    declare kind: EntryKind;
    declare position: number;
    declare title: CreationOptional<string>;
    /** Markdown for a note; unused by the other kinds. */
    declare body: CreationOptional<string>;
    /** What a map, contrast or separation shows (samples, binning, cuts); empty for a note. */
    declare settings: CreationOptional<Record<string, unknown>>;
    declare createdById: number | null;
    declare updatedById: number | null;
    declare createdAt: CreationOptional<Date>;
    declare updatedAt: CreationOptional<Date>;
    declare createdBy?: NonAttribute<User | null>;
    declare updatedBy?: NonAttribute<User | null>;
  }
  return Entry.init(
    {
      ...idColumn,
      studyId: { type: DataTypes.INTEGER, allowNull: false },
      kind: { type: DataTypes.STRING, allowNull: false, validate: { isIn: [[...ENTRY_KINDS]] } },
      position: { type: DataTypes.INTEGER, allowNull: false },
      title: { type: DataTypes.STRING, allowNull: false, defaultValue: '' },
      body: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      settings: { type: DataTypes.JSON, allowNull: false, defaultValue: {} },
      createdById: { type: DataTypes.INTEGER, allowNull: true },
      updatedById: { type: DataTypes.INTEGER, allowNull: true },
      ...timestampColumns,
    },
    tableOptions(sequelize, 'entries'),
  );
}

export type Entry = InstanceType<ReturnType<typeof defineEntry>>;
