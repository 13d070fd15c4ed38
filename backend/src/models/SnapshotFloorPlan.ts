import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { SnapshotFloorPlan as SnapshotFloorPlanContent } from '@shared/schemas/revision';

/**
 * A floor plan as frozen by revisions, stored once per content: the key is the sha256 of the
 * canonical JSON of `content`, so every revision made on the same plan refers to the same row.
 */
export class SnapshotFloorPlan extends Model<InferAttributes<SnapshotFloorPlan>, InferCreationAttributes<SnapshotFloorPlan>> {
  declare checksum: string;
  declare content: SnapshotFloorPlanContent;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    SnapshotFloorPlan.init(
      {
        checksum: { type: DataTypes.STRING(64), primaryKey: true },
        content: { type: DataTypes.JSONB, allowNull: false },
        createdAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { sequelize, tableName: 'snapshot_floor_plans', timestamps: false },
    );
  }
}
