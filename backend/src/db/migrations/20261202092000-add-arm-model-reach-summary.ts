import { DataTypes, QueryTypes } from 'sequelize';
import { reachSummaryOfStored } from '../../services/armReachSummary';
import type { MigrationFn } from '../migrate';

// The catalogue's reach figures are stored with each model (computed when it is saved); rows that
// exist already get theirs here, so the list never computes a profile.
export const up: MigrationFn = async ({ context: qi }) => {
  await qi.addColumn('arm_models', 'reachSummary', { type: DataTypes.JSONB, allowNull: true });
  const rows = await qi.sequelize.query<{ id: number; params: unknown }>('SELECT id, params FROM arm_models ORDER BY id', { type: QueryTypes.SELECT });
  for (const row of rows) {
    const summary = reachSummaryOfStored(row.params);
    await qi.sequelize.query('UPDATE arm_models SET "reachSummary" = :summary::jsonb WHERE id = :id', {
      replacements: { id: row.id, summary: summary ? JSON.stringify(summary) : null },
    });
  }
};

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.removeColumn('arm_models', 'reachSummary');
};
