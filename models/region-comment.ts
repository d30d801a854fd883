import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { NonAttribute, Sequelize } from 'sequelize';
import { idColumn, tableOptions, timestampColumns } from './columns';
import type { User } from './user';

export function defineRegionComment(sequelize: Sequelize) {
  /**
   * One comment of a region's thread, in Markdown. A deleted comment keeps its row without its text, so replies to
   * it keep their place; `editedAt` marks a changed one.
   */
  class RegionComment extends Model<InferAttributes<RegionComment>, InferCreationAttributes<RegionComment>> {
    declare id: CreationOptional<number>;
    declare regionId: number;
    declare authorId: number | null;
    declare replyToId: number | null;
    declare body: string;
    declare editedAt: CreationOptional<Date | null>;
    declare deletedAt: CreationOptional<Date | null>;
    declare createdAt: CreationOptional<Date>;
    declare updatedAt: CreationOptional<Date>;
    declare author?: NonAttribute<User | null>;
  }
  return RegionComment.init(
    {
      ...idColumn,
      regionId: { type: DataTypes.INTEGER, allowNull: false },
      authorId: { type: DataTypes.INTEGER, allowNull: true },
      replyToId: { type: DataTypes.INTEGER, allowNull: true },
      body: { type: DataTypes.TEXT, allowNull: false },
      editedAt: { type: DataTypes.DATE, allowNull: true },
      deletedAt: { type: DataTypes.DATE, allowNull: true },
      ...timestampColumns,
    },
    tableOptions(sequelize, 'region_comments'),
  );
}

export type RegionComment = InstanceType<ReturnType<typeof defineRegionComment>>;
