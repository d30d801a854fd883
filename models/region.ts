import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { NonAttribute, Sequelize } from 'sequelize';
import type { RegionGeometry } from '@/lib/physics/plane/region';
import { idColumn, tableOptions, timestampColumns } from './columns';
import type { RegionCategory } from './region-category';
import type { User } from './user';
import { REGION_STATES, type RegionState } from './vocabulary';

export function defineRegion(sequelize: Sequelize) {
  /**
   * An annotated area of a study's plane, in plane coordinates (so it stays put when bins, ranges or samples
   * change); `entryId` is the view it was drawn on, kept for the link only (it shows on every view of its axes).
   */
  class Region extends Model<InferAttributes<Region>, InferCreationAttributes<Region>> {
    declare id: CreationOptional<number>;
    declare studyId: number;
    declare entryId: number | null;
    declare categoryId: number | null;
    declare title: string;
    declare geometry: RegionGeometry;
    declare state: CreationOptional<RegionState>;
    declare createdById: number | null;
    declare stateChangedById: CreationOptional<number | null>;
    declare stateChangedAt: CreationOptional<Date | null>;
    declare createdAt: CreationOptional<Date>;
    declare updatedAt: CreationOptional<Date>;
    declare category?: NonAttribute<RegionCategory | null>;
    declare createdBy?: NonAttribute<User | null>;
    declare stateChangedBy?: NonAttribute<User | null>;
  }
  return Region.init(
    {
      ...idColumn,
      studyId: { type: DataTypes.INTEGER, allowNull: false },
      entryId: { type: DataTypes.INTEGER, allowNull: true },
      categoryId: { type: DataTypes.INTEGER, allowNull: true },
      title: { type: DataTypes.STRING, allowNull: false },
      geometry: { type: DataTypes.JSON, allowNull: false },
      state: { type: DataTypes.STRING, allowNull: false, defaultValue: 'open', validate: { isIn: [[...REGION_STATES]] } },
      createdById: { type: DataTypes.INTEGER, allowNull: true },
      stateChangedById: { type: DataTypes.INTEGER, allowNull: true },
      stateChangedAt: { type: DataTypes.DATE, allowNull: true },
      ...timestampColumns,
    },
    tableOptions(sequelize, 'regions'),
  );
}

export type Region = InstanceType<ReturnType<typeof defineRegion>>;
