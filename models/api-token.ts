import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { NonAttribute, Sequelize } from 'sequelize';
import { idColumn, tableOptions, timestampColumns } from './columns';
import type { User } from './user';

export function defineApiToken(sequelize: Sequelize) {
  /** A personal API token: the secret is shown once; only its SHA-256 is kept. Revoking deletes the row. */
  class ApiToken extends Model<InferAttributes<ApiToken>, InferCreationAttributes<ApiToken>> {
    declare id: CreationOptional<number>;
    declare userId: number;
    declare name: string;
    /** The secret's first characters, shown in lists. */
    declare prefix: string;
    declare secretHash: string;
    declare lastUsedAt: CreationOptional<Date | null>;
    declare createdAt: CreationOptional<Date>;
    declare updatedAt: CreationOptional<Date>;
    declare user?: NonAttribute<User>;
  }
  return ApiToken.init(
    {
      ...idColumn,
      userId: { type: DataTypes.INTEGER, allowNull: false },
      name: { type: DataTypes.STRING, allowNull: false },
      prefix: { type: DataTypes.STRING, allowNull: false },
      secretHash: { type: DataTypes.STRING, allowNull: false, unique: true },
      lastUsedAt: { type: DataTypes.DATE, allowNull: true },
      ...timestampColumns,
    },
    tableOptions(sequelize, 'api_tokens'),
  );
}

export type ApiToken = InstanceType<ReturnType<typeof defineApiToken>>;
