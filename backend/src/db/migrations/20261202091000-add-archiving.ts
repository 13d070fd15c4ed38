import { DataTypes, QueryTypes, type QueryInterface } from 'sequelize';
import type { MigrationFn } from '../migrate';

/** Name of the foreign key of revisions.<column> (created by createTable with its default name). */
async function fkName(qi: QueryInterface, column: string): Promise<string> {
  const rows = await qi.sequelize.query<{ conname: string }>(
    `SELECT c.conname FROM pg_constraint c
       JOIN pg_attribute a ON a.attrelid = c.conrelid AND a.attnum = ANY (c.conkey)
      WHERE c.conrelid = 'revisions'::regclass AND c.contype = 'f' AND a.attname = :column`,
    { replacements: { column }, type: QueryTypes.SELECT },
  );
  if (rows.length !== 1) throw new Error(`expected one foreign key on revisions.${column}, found ${rows.length}`);
  return rows[0].conname;
}

async function setRevisionForeignKeys(qi: QueryInterface, onDelete: 'RESTRICT' | 'CASCADE'): Promise<void> {
  for (const [column, table] of [['layoutId', 'layouts'], ['projectId', 'projects']] as const) {
    const name = await fkName(qi, column);
    await qi.sequelize.query(
      `ALTER TABLE revisions DROP CONSTRAINT "${name}",
         ADD CONSTRAINT "revisions_${column}_fkey" FOREIGN KEY ("${column}") REFERENCES ${table} (id) ON DELETE ${onDelete}`,
    );
  }
}

/**
 * Archiving of projects and layouts (hidden, read-only, restorable), and revisions that the
 * database will not let go with their layout or project: deleting one that has revisions fails.
 */
export const up: MigrationFn = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    for (const table of ['projects', 'layouts']) {
      await qi.addColumn(table, 'archivedAt', { type: DataTypes.DATE, allowNull: true }, { transaction });
      await qi.addColumn(table, 'archivedBy', { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' }, { transaction });
    }
  });
  await setRevisionForeignKeys(qi, 'RESTRICT');
};

export const down: MigrationFn = async ({ context: qi }) => {
  await setRevisionForeignKeys(qi, 'CASCADE');
  for (const table of ['layouts', 'projects']) {
    await qi.removeColumn(table, 'archivedBy');
    await qi.removeColumn(table, 'archivedAt');
  }
};
