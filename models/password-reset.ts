import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { Sequelize } from 'sequelize';
import { idColumn, tableOptions, timestampColumns } from './columns';

export function definePasswordReset(sequelize: Sequelize) {
  /** A password reset link sent by mail: usable once, until it expires. */
  class PasswordReset extends Model<InferAttributes<PasswordReset>, InferCreationAttributes<PasswordReset>> {
    declare id: CreationOptional<number>;
    declare userId: number;
    /** SHA-256 of the link's secret. */
    declare secretHash: string;
    declare expiresAt: Date;
    declare usedAt: CreationOptional<Date | null>;
    declare createdAt: CreationOptional<Date>;
    declare updatedAt: CreationOptional<Date>;
  }
  return PasswordReset.init(
    {
      ...idColumn,
      userId: { type: DataTypes.INTEGER, allowNull: false },
      secretHash: { type: DataTypes.STRING, allowNull: false, unique: true },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      usedAt: { type: DataTypes.DATE, allowNull: true },
      ...timestampColumns,
    },
    tableOptions(sequelize, 'password_resets'),
  );
}

export type PasswordReset = InstanceType<ReturnType<typeof definePasswordReset>>;
