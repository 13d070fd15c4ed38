import { DataTypes } from 'sequelize';
import type { MigrationFn } from '../migrate';

/** Hit counters of the rate limiters, shared by every server on the database. */
export const up: MigrationFn = async ({ context: qi }) => {
  await qi.createTable('rate_limit_hits', {
    key: { type: DataTypes.STRING(400), primaryKey: true },
    hits: { type: DataTypes.INTEGER, allowNull: false },
    resetAt: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex('rate_limit_hits', ['resetAt']);
};

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.dropTable('rate_limit_hits');
};
