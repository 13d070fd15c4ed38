import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { upgradeSnapshotNames, type StoredRevisionSnapshot } from '@shared/schemas/revision';

export const REVISION_STATES = ['submitted', 'returned', 'signed_off', 'released'] as const;
export type RevisionState = (typeof REVISION_STATES)[number];

/**
 * An immutable snapshot of a layout (content, analysis, floor plan, arm models) with its review
 * state. The snapshot, checksum and letter never change once written (a database trigger refuses it).
 */
export class Revision extends Model<InferAttributes<Revision>, InferCreationAttributes<Revision>> {
  declare id: CreationOptional<number>;
  declare layoutId: number;
  declare projectId: number;
  declare letter: string;
  /** Frozen when the revision is submitted (shared/schemas/revision.ts), without its floor plan. */
  declare snapshot: StoredRevisionSnapshot;
  /** The frozen floor plan (snapshot_floor_plans.checksum), null when the layout had none or it is inline. */
  declare floorPlanChecksum: CreationOptional<string | null>;
  /** sha256 of the canonical JSON of the whole snapshot, floor plan included, hex. */
  declare checksum: string;
  declare state: RevisionState;
  declare submittedBy: number | null;
  declare submittedAt: Date;
  declare decidedBy: CreationOptional<number | null>;
  declare decidedAt: CreationOptional<Date | null>;
  declare decisionComment: CreationOptional<string | null>;
  declare releasedBy: CreationOptional<number | null>;
  declare releasedAt: CreationOptional<Date | null>;
  /** The date printed on the released sheet; re-rendering with it gives the same bytes. */
  declare sheetCreatedAt: CreationOptional<Date | null>;
  declare planSheet: CreationOptional<Buffer | null>;
  declare planSheetChecksum: CreationOptional<string | null>;

  /** The snapshot JSON exactly as stored, older names included. */
  storedSnapshot(): StoredRevisionSnapshot {
    return this.getDataValue('snapshot');
  }

  static initModel(sequelize: Sequelize) {
    Revision.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        layoutId: { type: DataTypes.INTEGER, allowNull: false },
        projectId: { type: DataTypes.INTEGER, allowNull: false },
        letter: { type: DataTypes.STRING(8), allowNull: false },
        // Read under today's names; `storedSnapshot()` gives the JSON as stored (what the checksum covers).
        snapshot: {
          type: DataTypes.JSONB,
          allowNull: false,
          get(this: Revision) {
            return upgradeSnapshotNames(this.getDataValue('snapshot'));
          },
        },
        floorPlanChecksum: { type: DataTypes.STRING(64), allowNull: true },
        checksum: { type: DataTypes.STRING(64), allowNull: false },
        state: { type: DataTypes.STRING(24), allowNull: false },
        submittedBy: { type: DataTypes.INTEGER, allowNull: true },
        submittedAt: { type: DataTypes.DATE, allowNull: false },
        decidedBy: { type: DataTypes.INTEGER, allowNull: true },
        decidedAt: { type: DataTypes.DATE, allowNull: true },
        decisionComment: { type: DataTypes.TEXT, allowNull: true },
        releasedBy: { type: DataTypes.INTEGER, allowNull: true },
        releasedAt: { type: DataTypes.DATE, allowNull: true },
        sheetCreatedAt: { type: DataTypes.DATE, allowNull: true },
        planSheet: { type: DataTypes.BLOB, allowNull: true },
        planSheetChecksum: { type: DataTypes.STRING(64), allowNull: true },
      },
      { sequelize, tableName: 'revisions', timestamps: false },
    );
  }
}
