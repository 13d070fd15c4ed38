import { randomBytes } from 'node:crypto';
import { QueryTypes, type Sequelize } from 'sequelize';

/**
 * The session-signing secret: SESSION_SECRET when set, else one generated once and kept in the
 * database, so sessions survive restarts and every server on the same database agrees.
 */
export async function ensureSessionSecret(sequelize: Sequelize, fromEnv?: string): Promise<string> {
  if (fromEnv) return fromEnv;
  await sequelize.query(
    `INSERT INTO app_settings (key, value) VALUES ('session_secret', :v) ON CONFLICT (key) DO NOTHING`,
    { replacements: { v: randomBytes(32).toString('hex') }, type: QueryTypes.INSERT },
  );
  const rows = await sequelize.query<{ value: string }>(`SELECT value FROM app_settings WHERE key = 'session_secret'`, {
    type: QueryTypes.SELECT,
  });
  return rows[0].value;
}
