import { DataTypes } from 'sequelize';
import type { MigrationFn } from '../migrate';

export const up: MigrationFn = async ({ context: qi }) => {
  await qi.createTable('mail_deliveries', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    kind: { type: DataTypes.STRING(32), allowNull: false },
    revisionId: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'revisions', key: 'id' }, onDelete: 'CASCADE' },
    to: { type: DataTypes.JSONB, allowNull: false },
    subject: { type: DataTypes.STRING(500), allowNull: false },
    status: { type: DataTypes.STRING(16), allowNull: false },
    error: { type: DataTypes.TEXT, allowNull: true },
    attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    lastAttemptAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex('mail_deliveries', ['revisionId']);
};

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.dropTable('mail_deliveries');
};
