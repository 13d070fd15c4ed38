import { DataTypes } from 'sequelize';
import type { MigrationFn } from '../migrate';

export const up: MigrationFn = async ({ context: qi }) => {
  await qi.createTable('floor_plans', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    projectId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'projects', key: 'id' }, onDelete: 'CASCADE' },
    fileName: { type: DataTypes.STRING(255), allowNull: false },
    originalDxf: { type: DataTypes.BLOB, allowNull: false },
    units: { type: DataTypes.STRING(16), allowNull: false },
    unitsSource: { type: DataTypes.STRING(16), allowNull: false },
    bounds: { type: DataTypes.JSONB, allowNull: false },
    layers: { type: DataTypes.JSONB, allowNull: false },
    geometry: { type: DataTypes.JSONB, allowNull: false },
    warnings: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    stats: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    createdBy: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    createdAt: { type: DataTypes.DATE, allowNull: false },
    updatedAt: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex('floor_plans', ['projectId']);
};

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.dropTable('floor_plans');
};
