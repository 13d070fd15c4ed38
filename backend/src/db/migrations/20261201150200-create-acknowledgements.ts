import { DataTypes } from 'sequelize';
import type { MigrationFn } from '../migrate';

export const up: MigrationFn = async ({ context: qi }) => {
  await qi.createTable('acknowledgements', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    revisionId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'revisions', key: 'id' }, onDelete: 'CASCADE' },
    userId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex('acknowledgements', ['revisionId', 'userId'], { unique: true });
};

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.dropTable('acknowledgements');
};
