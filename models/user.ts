import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { Sequelize } from 'sequelize';
import { idColumn, tableOptions, timestampColumns } from './columns';
import { SITE_ROLES, type NotificationKind, type SiteRole } from './vocabulary';

export function defineUser(sequelize: Sequelize) {
  class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
    declare id: CreationOptional<number>;
    /** Stored trimmed and lower-cased, so uniqueness ignores case. */
    declare email: string;
    declare name: string;
    declare passwordHash: string;
    declare siteRole: CreationOptional<SiteRole>;
    declare disabled: CreationOptional<boolean>;
    /** Raised to end every session issued before; sessions carry the value they were issued with. */
    declare sessionVersion: CreationOptional<number>;
    /** Notification kinds the person gets no mail about. */
    declare mailKindsOff: CreationOptional<NotificationKind[]>;
    /** One mail a day with every notification instead of one mail each. */
    declare mailDigest: CreationOptional<boolean>;
    /** When the last digest went out (or the digest was turned on): the next one is due a day later. */
    declare digestSentAt: CreationOptional<Date | null>;
    declare createdAt: CreationOptional<Date>;
    declare updatedAt: CreationOptional<Date>;
  }
  return User.init(
    {
      ...idColumn,
      email: { type: DataTypes.STRING, allowNull: false, unique: true },
      name: { type: DataTypes.STRING, allowNull: false },
      passwordHash: { type: DataTypes.STRING, allowNull: false },
      siteRole: {
        type: DataTypes.STRING,
        allowNull: false,
        defaultValue: 'member',
        validate: { isIn: [[...SITE_ROLES]] },
      },
      disabled: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      sessionVersion: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
      mailKindsOff: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
      mailDigest: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      digestSentAt: { type: DataTypes.DATE, allowNull: true },
      ...timestampColumns,
    },
    tableOptions(sequelize, 'users'),
  );
}

export type User = InstanceType<ReturnType<typeof defineUser>>;
