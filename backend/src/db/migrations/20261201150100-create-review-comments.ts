import { DataTypes } from 'sequelize';
import type { MigrationFn } from '../migrate';

export const up: MigrationFn = async ({ context: qi }) => {
  await qi.createTable('review_comments', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    revisionId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'revisions', key: 'id' }, onDelete: 'CASCADE' },
    authorId: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    findingId: { type: DataTypes.STRING(200), allowNull: true },
    pointX: { type: DataTypes.DOUBLE, allowNull: true },
    pointY: { type: DataTypes.DOUBLE, allowNull: true },
    body: { type: DataTypes.TEXT, allowNull: false },
    resolved: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    resolvedBy: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    resolvedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: { type: DataTypes.DATE, allowNull: false },
    updatedAt: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex('review_comments', ['revisionId']);
  await qi.addIndex('review_comments', ['findingId']);
};

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.dropTable('review_comments');
};
