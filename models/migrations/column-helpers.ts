import { DataTypes } from 'sequelize';

// Column definitions the migrations share: snake_case timestamps, integer ids, foreign keys.

export const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
};

export const id = { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true };

export function reference(table: string, onDelete: 'CASCADE' | 'SET NULL') {
  return { references: { model: table, key: 'id' }, onDelete, onUpdate: 'CASCADE' };
}
