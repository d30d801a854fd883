import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { Sequelize } from 'sequelize';
import { tableOptions, timestampColumns } from './columns';

export const SITE_SETTINGS_ID = 1;

export function defineSiteSetting(sequelize: Sequelize) {
  /** The site-wide settings: a single row whose id is SITE_SETTINGS_ID, created by the first migration. */
  class SiteSetting extends Model<InferAttributes<SiteSetting>, InferCreationAttributes<SiteSetting>> {
    declare id: number;
    declare openSignup: boolean;
    declare createdAt: CreationOptional<Date>;
    declare updatedAt: CreationOptional<Date>;
  }
  return SiteSetting.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true },
      openSignup: { type: DataTypes.BOOLEAN, allowNull: false },
      ...timestampColumns,
    },
    tableOptions(sequelize, 'site_settings'),
  );
}

export type SiteSetting = InstanceType<ReturnType<typeof defineSiteSetting>>;
