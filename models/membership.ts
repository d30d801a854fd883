import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from 'sequelize';
import type { User } from './user';
import { STUDY_ROLES, type StudyRole } from './vocabulary';

export function defineMembership(sequelize: Sequelize) {
  class Membership extends Model<InferAttributes<Membership>, InferCreationAttributes<Membership>> {
    declare id: CreationOptional<number>;
    declare studyId: number;
    declare userId: number;
    declare role: StudyRole;
    declare createdAt: CreationOptional<Date>;
    declare updatedAt: CreationOptional<Date>;
    declare user?: NonAttribute<User>;
  }
  return Membership.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      studyId: { type: DataTypes.INTEGER, allowNull: false },
      userId: { type: DataTypes.INTEGER, allowNull: false },
      role: {
        type: DataTypes.STRING,
        allowNull: false,
        validate: { isIn: [[...STUDY_ROLES]] },
      },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'memberships', underscored: true },
  );
}

export type Membership = InstanceType<ReturnType<typeof defineMembership>>;
