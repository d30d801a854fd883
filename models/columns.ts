import { DataTypes, type Sequelize } from 'sequelize';

// What every table shares: an integer id, creation and change times, snake_case column names.

export const idColumn = { id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true } };

export const timestampColumns = { createdAt: DataTypes.DATE, updatedAt: DataTypes.DATE };

export function tableOptions(sequelize: Sequelize, tableName: string) {
  return { sequelize, tableName, underscored: true };
}
