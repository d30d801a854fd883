import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

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
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'site_settings', underscored: true },
  );
}

export type SiteSetting = InstanceType<ReturnType<typeof defineSiteSetting>>;
