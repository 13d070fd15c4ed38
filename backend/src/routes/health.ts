import { Router } from 'express';
import type { Sequelize } from 'sequelize';

/** GET /api/health → {ok, db}: the process answers, and whether the database does. */
export function healthRouter(sequelize: Sequelize): Router {
  const r = Router();
  r.get('/health', async (_req, res) => {
    let db = false;
    try {
      await sequelize.query('SELECT 1');
      db = true;
    } catch {
      db = false;
    }
    res.status(db ? 200 : 503).json({ ok: db, db });
  });
  return r;
}
