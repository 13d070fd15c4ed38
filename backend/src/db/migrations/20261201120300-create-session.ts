import type { MigrationFn } from '../migrate';

// connect-pg-simple's table (its documented schema), created here rather than at run time.
export const up: MigrationFn = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE "session" (
      "sid" varchar NOT NULL COLLATE "default" PRIMARY KEY,
      "sess" json NOT NULL,
      "expire" timestamp(6) NOT NULL
    );
    CREATE INDEX "IDX_session_expire" ON "session" ("expire");
  `);
};

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.sequelize.query('DROP TABLE IF EXISTS "session"');
};
