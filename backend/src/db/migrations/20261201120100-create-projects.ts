import { DataTypes } from 'sequelize';
import type { MigrationFn } from '../migrate';

export const up: MigrationFn = async ({ context: qi }) => {
  await qi.createTable('projects', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    name: { type: DataTypes.STRING(160), allowNull: false },
    clientName: { type: DataTypes.STRING(160), allowNull: false },
    siteName: { type: DataTypes.STRING(160), allowNull: false, defaultValue: '' },
    description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    createdBy: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    createdAt: { type: DataTypes.DATE, allowNull: false },
    updatedAt: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.createTable('project_members', {
    projectId: { type: DataTypes.INTEGER, allowNull: false, primaryKey: true, references: { model: 'projects', key: 'id' }, onDelete: 'CASCADE' },
    userId: { type: DataTypes.INTEGER, allowNull: false, primaryKey: true, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    createdAt: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex('project_members', ['userId']);
};

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.dropTable('project_members');
  await qi.dropTable('projects');
};
