import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { NonAttribute, Sequelize } from 'sequelize';
import { idColumn, tableOptions, timestampColumns } from './columns';
import type { Study } from './study';
import type { User } from './user';
import { STUDY_ROLES, type StudyRole } from './vocabulary';

export function defineInvitation(sequelize: Sequelize) {
  /** An invitation by e-mail into a study; pending until accepted. Revoking deletes the row. */
  class Invitation extends Model<InferAttributes<Invitation>, InferCreationAttributes<Invitation>> {
    declare id: CreationOptional<number>;
    declare studyId: number;
    declare email: string;
    declare role: StudyRole;
    declare invitedById: number | null;
    /** SHA-256 of the link's secret; the link itself is never stored. */
    declare secretHash: string;
    declare expiresAt: Date;
    declare acceptedAt: CreationOptional<Date | null>;
    declare acceptedById: CreationOptional<number | null>;
    declare createdAt: CreationOptional<Date>;
    declare updatedAt: CreationOptional<Date>;
    declare study?: NonAttribute<Study>;
    declare invitedBy?: NonAttribute<User | null>;
  }
  return Invitation.init(
    {
      ...idColumn,
      studyId: { type: DataTypes.INTEGER, allowNull: false },
      email: { type: DataTypes.STRING, allowNull: false },
      role: { type: DataTypes.STRING, allowNull: false, validate: { isIn: [[...STUDY_ROLES]] } },
      invitedById: { type: DataTypes.INTEGER, allowNull: true },
      secretHash: { type: DataTypes.STRING, allowNull: false, unique: true },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      acceptedAt: { type: DataTypes.DATE, allowNull: true },
      acceptedById: { type: DataTypes.INTEGER, allowNull: true },
      ...timestampColumns,
    },
    tableOptions(sequelize, 'invitations'),
  );
}

export type Invitation = InstanceType<ReturnType<typeof defineInvitation>>;
