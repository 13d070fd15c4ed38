import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { FeatureCollection } from 'geojson';

export interface FloorPlanLayer {
  name: string;
  role: 'outline' | 'wall' | 'column' | 'obstacle' | 'ignore';
  height: number | null;
  entityCount: number;
  color: string;
}

export class FloorPlan extends Model<InferAttributes<FloorPlan>, InferCreationAttributes<FloorPlan>> {
  declare id: CreationOptional<number>;
  declare projectId: number;
  declare fileName: string;
  declare originalDxf: Buffer;
  declare units: string;
  declare unitsSource: string;
  declare bounds: { minX: number; minY: number; maxX: number; maxY: number };
  declare layers: FloorPlanLayer[];
  declare geometry: FeatureCollection;
  declare warnings: CreationOptional<string[]>;
  declare stats: CreationOptional<Record<string, unknown>>;
  declare origin: CreationOptional<{ x: number; y: number }>;
  declare notes: CreationOptional<{ ignored: string[]; unread: string[] }>;
  declare createdBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    FloorPlan.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        projectId: { type: DataTypes.INTEGER, allowNull: false },
        fileName: { type: DataTypes.STRING(255), allowNull: false },
        originalDxf: { type: DataTypes.BLOB, allowNull: false },
        units: { type: DataTypes.STRING(16), allowNull: false },
        unitsSource: { type: DataTypes.STRING(16), allowNull: false },
        bounds: { type: DataTypes.JSONB, allowNull: false },
        layers: { type: DataTypes.JSONB, allowNull: false },
        geometry: { type: DataTypes.JSONB, allowNull: false },
        warnings: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        stats: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        origin: { type: DataTypes.JSONB, allowNull: false, defaultValue: { x: 0, y: 0 } },
        notes: { type: DataTypes.JSONB, allowNull: false, defaultValue: { ignored: [], unread: [] } },
        createdBy: { type: DataTypes.INTEGER, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      // The original file and geometry are large: list queries exclude them explicitly.
      { sequelize, tableName: 'floor_plans' },
    );
  }
}
