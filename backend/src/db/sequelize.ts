import { Sequelize } from 'sequelize';
import pg from 'pg';
import { initModels } from '../models';

// Return BIGINT counts and ids as numbers (ids stay far below 2^53).
pg.types.setTypeParser(20, (v) => Number.parseInt(v, 10));

/** Creates the Sequelize instance for a PostgreSQL URL and initialises every model on it. */
export function createSequelize(databaseUrl: string, opts: { logging?: boolean; pool?: number } = {}): Sequelize {
  const sequelize = new Sequelize(databaseUrl, {
    dialect: 'postgres',
    dialectModule: pg,
    logging: opts.logging ? (sql) => console.log(sql) : false,
    pool: { max: opts.pool ?? 10, min: 0, idle: 10_000, acquire: 10_000 },
    define: { underscored: false },
  });
  initModels(sequelize);
  return sequelize;
}
