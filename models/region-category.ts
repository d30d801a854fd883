import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { Sequelize } from 'sequelize';
import { idColumn, tableOptions, timestampColumns } from './columns';

export function defineRegionCategory(sequelize: Sequelize) {
  /** A kind of region a study distinguishes ("excess", "check binning"), with the colour its regions are drawn in. */
  class RegionCategory extends Model<InferAttributes<RegionCategory>, InferCreationAttributes<RegionCategory>> {
    declare id: CreationOptional<number>;
    declare studyId: number;
    declare name: string;
    /** #rrggbb */
    declare colour: string;
    declare createdAt: CreationOptional<Date>;
    declare updatedAt: CreationOptional<Date>;
  }
  return RegionCategory.init(
    {
      ...idColumn,
      studyId: { type: DataTypes.INTEGER, allowNull: false },
      name: { type: DataTypes.STRING, allowNull: false },
      colour: { type: DataTypes.STRING, allowNull: false },
      ...timestampColumns,
    },
    tableOptions(sequelize, 'region_categories'),
  );
}

export type RegionCategory = InstanceType<ReturnType<typeof defineRegionCategory>>;
