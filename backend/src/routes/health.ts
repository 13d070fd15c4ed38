import { Router } from 'express';
import type { Sequelize } from 'sequelize';

/** GET /api/health → {ok, db:'up'|'down'}: the process answers, and whether the database does (503 when not). */
export function healthRouter(sequelize: Sequelize): Router {
  const r = Router();
  r.get('/health', async (_req, res) => {
    const up = await sequelize.query('SELECT 1').then(
      () => true,
      () => false,
    );
    res.status(up ? 200 : 503).json({ ok: up, db: up ? 'up' : 'down' });
  });
  return r;
}
