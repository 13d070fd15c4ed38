import { DataTypes } from 'sequelize';
import type { MigrationFn } from '../migrate';

export const up: MigrationFn = async ({ context: qi }) => {
  await qi.createTable('revisions', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    layoutId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'layouts', key: 'id' }, onDelete: 'CASCADE' },
    projectId: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'projects', key: 'id' }, onDelete: 'CASCADE' },
    letter: { type: DataTypes.STRING(8), allowNull: false },
    snapshot: { type: DataTypes.JSONB, allowNull: false },
    checksum: { type: DataTypes.STRING(64), allowNull: false },
    state: { type: DataTypes.STRING(24), allowNull: false },
    submittedBy: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    submittedAt: { type: DataTypes.DATE, allowNull: false },
    decidedBy: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    decidedAt: { type: DataTypes.DATE, allowNull: true },
    decisionComment: { type: DataTypes.TEXT, allowNull: true },
    releasedBy: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    releasedAt: { type: DataTypes.DATE, allowNull: true },
    sheetCreatedAt: { type: DataTypes.DATE, allowNull: true },
    planSheet: { type: DataTypes.BLOB, allowNull: true },
    planSheetChecksum: { type: DataTypes.STRING(64), allowNull: true },
  });
  await qi.addIndex('revisions', ['layoutId', 'letter'], { unique: true });
  await qi.addIndex('revisions', ['projectId']);
  // At most one open (submitted) revision per layout, enforced by the database too.
  await qi.sequelize.query(`CREATE UNIQUE INDEX revisions_one_open_per_layout ON revisions ("layoutId") WHERE state = 'submitted'`);
  // The frozen part of a revision never changes, whoever writes to the table.
  await qi.sequelize.query(`
    CREATE FUNCTION revisions_keep_frozen() RETURNS trigger AS $$
    BEGIN
      IF NEW.snapshot IS DISTINCT FROM OLD.snapshot OR NEW.checksum IS DISTINCT FROM OLD.checksum
         OR NEW.letter IS DISTINCT FROM OLD.letter OR NEW."layoutId" IS DISTINCT FROM OLD."layoutId"
         OR (OLD."planSheet" IS NOT NULL AND NEW."planSheet" IS DISTINCT FROM OLD."planSheet")
         OR (OLD.state = 'released' AND NEW.state IS DISTINCT FROM OLD.state) THEN
        RAISE EXCEPTION 'revision % is immutable', OLD.id USING ERRCODE = 'check_violation';
      END IF;
      RETURN NEW;
    END $$ LANGUAGE plpgsql`);
  await qi.sequelize.query(`CREATE TRIGGER revisions_keep_frozen BEFORE UPDATE ON revisions FOR EACH ROW EXECUTE FUNCTION revisions_keep_frozen()`);
};

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.dropTable('revisions');
  await qi.sequelize.query('DROP FUNCTION IF EXISTS revisions_keep_frozen()');
};
