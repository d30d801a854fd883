import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { NonAttribute, Sequelize } from 'sequelize';
import { idColumn, tableOptions, timestampColumns } from './columns';
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
      ...idColumn,
      studyId: { type: DataTypes.INTEGER, allowNull: false },
      userId: { type: DataTypes.INTEGER, allowNull: false },
      role: { type: DataTypes.STRING, allowNull: false, validate: { isIn: [[...STUDY_ROLES]] } },
      ...timestampColumns,
    },
    tableOptions(sequelize, 'memberships'),
  );
}

export type Membership = InstanceType<ReturnType<typeof defineMembership>>;
