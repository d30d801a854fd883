import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

export function defineStudy(sequelize: Sequelize) {
  class Study extends Model<InferAttributes<Study>, InferCreationAttributes<Study>> {
    declare id: CreationOptional<number>;
    declare title: string;
    declare description: CreationOptional<string>;
    declare createdAt: CreationOptional<Date>;
    declare updatedAt: CreationOptional<Date>;
  }
  return Study.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      title: { type: DataTypes.STRING, allowNull: false },
      description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'studies', underscored: true },
  );
}

export type Study = InstanceType<ReturnType<typeof defineStudy>>;
