import { DataTypes } from 'sequelize';
import type { MigrationFn } from '../migrate';

export const up: MigrationFn = async ({ context: qi }) => {
  await qi.createTable('app_settings', {
    key: { type: DataTypes.STRING(80), primaryKey: true },
    value: { type: DataTypes.TEXT, allowNull: false },
  });
};

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.dropTable('app_settings');
};
