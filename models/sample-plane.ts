import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { Sequelize } from 'sequelize';
import type { HorizontalCoordinate } from '@/lib/physics/density';
import { idColumn, tableOptions, timestampColumns } from './columns';

export function defineSamplePlane(sequelize: Sequelize) {
  /** A done sample's fine-binned primary plane (PlaneHistogram bytes, Σw and Σw²), one per horizontal coordinate. */
  class SamplePlane extends Model<InferAttributes<SamplePlane>, InferCreationAttributes<SamplePlane>> {
    declare id: CreationOptional<number>;
    declare sampleId: number;
    declare horizontal: HorizontalCoordinate;
    declare histogram: Buffer;
    declare createdAt: CreationOptional<Date>;
    declare updatedAt: CreationOptional<Date>;
  }
  return SamplePlane.init(
    {
      ...idColumn,
      sampleId: { type: DataTypes.INTEGER, allowNull: false },
      horizontal: { type: DataTypes.STRING, allowNull: false },
      histogram: { type: DataTypes.BLOB, allowNull: false },
      ...timestampColumns,
    },
    tableOptions(sequelize, 'sample_planes'),
  );
}

export type SamplePlane = InstanceType<ReturnType<typeof defineSamplePlane>>;
