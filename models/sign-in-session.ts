import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { Sequelize } from 'sequelize';
import { idColumn, tableOptions, timestampColumns } from './columns';

export function defineSignInSession(sequelize: Sequelize) {
  /**
   * One signed-in browser session. Its random `key` travels inside the session token; the token counts only
   * while this row exists, so deleting the row ends the session on the server, whatever the browser keeps.
   */
  class SignInSession extends Model<InferAttributes<SignInSession>, InferCreationAttributes<SignInSession>> {
    declare id: CreationOptional<number>;
    declare key: string;
    declare userId: number;
    declare expiresAt: Date;
    declare createdAt: CreationOptional<Date>;
    declare updatedAt: CreationOptional<Date>;
  }
  return SignInSession.init(
    {
      ...idColumn,
      key: { type: DataTypes.STRING, allowNull: false, unique: true },
      userId: { type: DataTypes.INTEGER, allowNull: false },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      ...timestampColumns,
    },
    tableOptions(sequelize, 'sessions'),
  );
}

export type SignInSession = InstanceType<ReturnType<typeof defineSignInSession>>;
