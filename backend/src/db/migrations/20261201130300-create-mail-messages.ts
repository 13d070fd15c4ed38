import { DataTypes } from 'sequelize';
import type { MigrationFn } from '../migrate';

export const up: MigrationFn = async ({ context: qi }) => {
  await qi.createTable('mail_messages', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    from: { type: DataTypes.STRING(320), allowNull: false, defaultValue: '' },
    to: { type: DataTypes.JSONB, allowNull: false },
    subject: { type: DataTypes.STRING(500), allowNull: false, defaultValue: '' },
    text: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    attachments: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    raw: { type: DataTypes.BLOB, allowNull: false },
    at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  });
  await qi.addIndex('mail_messages', ['at']);
};

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.dropTable('mail_messages');
};
