import type { MigrationFn } from '../migrate';

// One name per concept in stored data. Cell layouts call what the planner draws "boundaries"
// (`zones` before), a floor plan's outline layers have the role `outline` (`boundary` before), and
// the reviewer's decisions use the drawing trade's words: states `returned` and `signed_off`
// (`changes_requested`, `approved`), audit actions `revision.return` and `revision.sign_off`.
// Revision snapshots and stored floor plans are frozen (their checksums cover them as stored): they
// keep their old names and are read under the new ones (shared/schemas/revision.ts).

const renameKey = (table: string, column: string, from: string, to: string) =>
  `UPDATE ${table} SET ${column} = (${column} - '${from}') || jsonb_build_object('${to}', ${column}->'${from}') WHERE ${column} ? '${from}' AND NOT ${column} ? '${to}'`;

const renameRole = (table: string, from: string, to: string) => `
  UPDATE ${table} SET layers = (
    SELECT jsonb_agg(CASE WHEN l->>'role' = '${from}' THEN jsonb_set(l, '{role}', '"${to}"') ELSE l END ORDER BY i)
    FROM jsonb_array_elements(layers) WITH ORDINALITY AS e(l, i))
  WHERE jsonb_typeof(layers) = 'array' AND EXISTS (SELECT 1 FROM jsonb_array_elements(layers) l WHERE l->>'role' = '${from}')`;

const STATES: Array<[string, string]> = [['changes_requested', 'returned'], ['approved', 'signed_off']];
const ACTIONS: Array<[string, string]> = [['revision.request_changes', 'revision.return'], ['revision.approve', 'revision.sign_off']];

async function rename(qi: Parameters<MigrationFn>[0]['context'], forward: boolean): Promise<void> {
  const pick = <T>(pairs: Array<[T, T]>) => pairs.map(([a, b]) => (forward ? [a, b] : [b, a]) as [T, T]);
  await qi.sequelize.transaction(async (transaction) => {
    const q = (sql: string) => qi.sequelize.query(sql, { transaction });
    const [fromKey, toKey] = forward ? ['zones', 'boundaries'] : ['boundaries', 'zones'];
    await q(renameKey('layouts', 'content', fromKey, toKey));
    const [fromRole, toRole] = forward ? ['boundary', 'outline'] : ['outline', 'boundary'];
    await q(renameRole('floor_plans', fromRole, toRole));
    await q(renameRole('project_layer_roles', fromRole, toRole));
    for (const [a, b] of pick(STATES)) await q(`UPDATE revisions SET state = '${b}' WHERE state = '${a}'`);
    for (const [a, b] of pick(ACTIONS)) await q(`UPDATE audit_events SET action = '${b}' WHERE action = '${a}'`);
  });
}

export const up: MigrationFn = async ({ context: qi }) => rename(qi, true);
export const down: MigrationFn = async ({ context: qi }) => rename(qi, false);
