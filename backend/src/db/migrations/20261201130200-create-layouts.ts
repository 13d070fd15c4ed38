import { DataTypes } from 'sequelize';
import type { MigrationFn } from '../migrate';

export const up: MigrationFn = async ({ context: qi }) => {
  await qi.createTable('layouts', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    projectId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'projects', key: 'id' }, onDelete: 'CASCADE' },
    floorPlanId: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'floor_plans', key: 'id' }, onDelete: 'RESTRICT' },
    name: { type: DataTypes.STRING(160), allowNull: false },
    content: { type: DataTypes.JSONB, allowNull: false },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    createdBy: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    createdAt: { type: DataTypes.DATE, allowNull: false },
    updatedAt: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex('layouts', ['projectId']);
  await qi.addIndex('layouts', ['floorPlanId']);
};

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.dropTable('layouts');
};
