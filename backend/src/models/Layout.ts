import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export class Layout extends Model<InferAttributes<Layout>, InferCreationAttributes<Layout>> {
  declare id: CreationOptional<number>;
  declare projectId: number;
  declare floorPlanId: number | null;
  declare name: string;
  /** Arms, work points, boundaries and work heights (shared/schemas/layout.ts), plan mm / degrees. */
  declare content: Record<string, unknown>;
  /** Optimistic lock: a PUT must carry the version it edited. */
  declare version: CreationOptional<number>;
  declare createdBy: number | null;
  /** Set while archived: hidden from lists, read-only, restorable by an admin. */
  declare archivedAt: CreationOptional<Date | null>;
  declare archivedBy: CreationOptional<number | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Layout.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        projectId: { type: DataTypes.INTEGER, allowNull: false },
        floorPlanId: { type: DataTypes.INTEGER, allowNull: true },
        name: { type: DataTypes.STRING(160), allowNull: false },
        content: { type: DataTypes.JSONB, allowNull: false },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
        createdBy: { type: DataTypes.INTEGER, allowNull: true },
        archivedAt: { type: DataTypes.DATE, allowNull: true },
        archivedBy: { type: DataTypes.INTEGER, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'layouts' },
    );
  }
}
