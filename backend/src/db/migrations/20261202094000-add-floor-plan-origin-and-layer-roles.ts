import { DataTypes } from 'sequelize';
import type { MigrationFn } from '../migrate';

// A floor plan keeps the offset of its local origin and its grouped import notes; a project
// keeps the layer roles a planner saved, for the next drawing uploaded to it.
export const up: MigrationFn = async ({ context: qi }) => {
  await qi.addColumn('floor_plans', 'origin', { type: DataTypes.JSONB, allowNull: false, defaultValue: { x: 0, y: 0 } });
  await qi.addColumn('floor_plans', 'notes', { type: DataTypes.JSONB, allowNull: false, defaultValue: { ignored: [], unread: [] } });
  await qi.createTable('project_layer_roles', {
    projectId: { type: DataTypes.INTEGER, primaryKey: true, references: { model: 'projects', key: 'id' }, onDelete: 'CASCADE' },
    layers: { type: DataTypes.JSONB, allowNull: false },
    updatedBy: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    createdAt: { type: DataTypes.DATE, allowNull: false },
    updatedAt: { type: DataTypes.DATE, allowNull: false },
  });
};

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.dropTable('project_layer_roles');
  await qi.removeColumn('floor_plans', 'notes');
  await qi.removeColumn('floor_plans', 'origin');
};
