import { createHash } from 'node:crypto';
import { DataTypes, QueryTypes } from 'sequelize';
import { canonicalJson } from '@shared/canonicalJson';
import type { MigrationFn } from '../migrate';

// A revision's floor plan is stored once per content (sha256 of its canonical JSON) and referred to
// from the revision, instead of a copy inside every snapshot. The revision's checksum is unchanged:
// it is still the sha256 of the canonical JSON of the whole snapshot, floor plan put back in.

const FROZEN_WITH_FLOOR_PLAN = `
  CREATE OR REPLACE FUNCTION revisions_keep_frozen() RETURNS trigger AS $$
  BEGIN
    IF NEW.snapshot IS DISTINCT FROM OLD.snapshot OR NEW.checksum IS DISTINCT FROM OLD.checksum
       OR NEW."floorPlanChecksum" IS DISTINCT FROM OLD."floorPlanChecksum"
       OR NEW.letter IS DISTINCT FROM OLD.letter OR NEW."layoutId" IS DISTINCT FROM OLD."layoutId"
       OR (OLD."planSheet" IS NOT NULL AND NEW."planSheet" IS DISTINCT FROM OLD."planSheet")
       OR (OLD.state = 'released' AND NEW.state IS DISTINCT FROM OLD.state) THEN
      RAISE EXCEPTION 'revision % is immutable', OLD.id USING ERRCODE = 'check_violation';
    END IF;
    RETURN NEW;
  END $$ LANGUAGE plpgsql`;

const FROZEN_BEFORE = `
  CREATE OR REPLACE FUNCTION revisions_keep_frozen() RETURNS trigger AS $$
  BEGIN
    IF NEW.snapshot IS DISTINCT FROM OLD.snapshot OR NEW.checksum IS DISTINCT FROM OLD.checksum
       OR NEW.letter IS DISTINCT FROM OLD.letter OR NEW."layoutId" IS DISTINCT FROM OLD."layoutId"
       OR (OLD."planSheet" IS NOT NULL AND NEW."planSheet" IS DISTINCT FROM OLD."planSheet")
       OR (OLD.state = 'released' AND NEW.state IS DISTINCT FROM OLD.state) THEN
      RAISE EXCEPTION 'revision % is immutable', OLD.id USING ERRCODE = 'check_violation';
    END IF;
    RETURN NEW;
  END $$ LANGUAGE plpgsql`;

// A stored plan never changes either: its key is its content's checksum.
const PLANS_FROZEN = `
  CREATE FUNCTION snapshot_floor_plans_keep_frozen() RETURNS trigger AS $$
  BEGIN
    RAISE EXCEPTION 'stored floor plan % is immutable', OLD.checksum USING ERRCODE = 'check_violation';
  END $$ LANGUAGE plpgsql`;

export const up: MigrationFn = async ({ context: qi }) => {
  const q = qi.sequelize;
  await qi.createTable('snapshot_floor_plans', {
    checksum: { type: DataTypes.STRING(64), primaryKey: true },
    content: { type: DataTypes.JSONB, allowNull: false },
    createdAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  });
  await q.query(PLANS_FROZEN);
  await q.query('CREATE TRIGGER snapshot_floor_plans_keep_frozen BEFORE UPDATE ON snapshot_floor_plans FOR EACH ROW EXECUTE FUNCTION snapshot_floor_plans_keep_frozen()');
  await qi.addColumn('revisions', 'floorPlanChecksum', {
    type: DataTypes.STRING(64),
    allowNull: true,
    references: { model: 'snapshot_floor_plans', key: 'checksum' },
    onDelete: 'RESTRICT',
  });
  await q.query('CREATE INDEX revisions_floor_plan_checksum ON revisions ("floorPlanChecksum")');
  await q.query(FROZEN_WITH_FLOOR_PLAN);

  // Existing revisions: move each inline floor plan into the table (one row per content). The
  // frozen-row trigger is paused for this move only; the content and the checksum stay the same.
  const ids = await q.query<{ id: number }>(`SELECT id FROM revisions WHERE jsonb_typeof(snapshot->'floorPlan') = 'object' ORDER BY id`, { type: QueryTypes.SELECT });
  if (!ids.length) return;
  await q.query('ALTER TABLE revisions DISABLE TRIGGER revisions_keep_frozen');
  try {
    for (const { id } of ids) {
      const [row] = await q.query<{ floorPlan: unknown }>(`SELECT snapshot->'floorPlan' AS "floorPlan" FROM revisions WHERE id = :id`, { replacements: { id }, type: QueryTypes.SELECT });
      const checksum = createHash('sha256').update(canonicalJson(row.floorPlan)).digest('hex');
      await q.query(`INSERT INTO snapshot_floor_plans (checksum, content, "createdAt") SELECT :checksum, snapshot->'floorPlan', now() FROM revisions WHERE id = :id ON CONFLICT (checksum) DO NOTHING`, {
        replacements: { id, checksum },
      });
      await q.query(`UPDATE revisions SET snapshot = snapshot - 'floorPlan', "floorPlanChecksum" = :checksum WHERE id = :id`, { replacements: { id, checksum } });
    }
  } finally {
    await q.query('ALTER TABLE revisions ENABLE TRIGGER revisions_keep_frozen');
  }
};

export const down: MigrationFn = async ({ context: qi }) => {
  const q = qi.sequelize;
  // Put every floor plan back into its snapshots (null where the layout had none), then drop the table.
  await q.query('ALTER TABLE revisions DISABLE TRIGGER revisions_keep_frozen');
  try {
    await q.query(`UPDATE revisions r SET snapshot = jsonb_set(r.snapshot, '{floorPlan}', f.content), "floorPlanChecksum" = NULL FROM snapshot_floor_plans f WHERE f.checksum = r."floorPlanChecksum"`);
    await q.query(`UPDATE revisions SET snapshot = jsonb_set(snapshot, '{floorPlan}', 'null'::jsonb) WHERE NOT jsonb_exists(snapshot, 'floorPlan')`);
  } finally {
    await q.query('ALTER TABLE revisions ENABLE TRIGGER revisions_keep_frozen');
  }
  await q.query(FROZEN_BEFORE);
  await q.query('DROP INDEX IF EXISTS revisions_floor_plan_checksum');
  await qi.removeColumn('revisions', 'floorPlanChecksum');
  await qi.dropTable('snapshot_floor_plans');
  await q.query('DROP FUNCTION IF EXISTS snapshot_floor_plans_keep_frozen()');
};
