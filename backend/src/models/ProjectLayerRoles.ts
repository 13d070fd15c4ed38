import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { SavedLayerRole } from '@shared/schemas/floorPlan';

/** The layer roles a planner saved for a project, applied to the next drawing uploaded to it. */
export class ProjectLayerRoles extends Model<InferAttributes<ProjectLayerRoles>, InferCreationAttributes<ProjectLayerRoles>> {
  declare projectId: number;
  declare layers: SavedLayerRole[];
  declare updatedBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    ProjectLayerRoles.init(
      {
        projectId: { type: DataTypes.INTEGER, primaryKey: true },
        layers: { type: DataTypes.JSONB, allowNull: false },
        updatedBy: { type: DataTypes.INTEGER, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'project_layer_roles' },
    );
  }
}
