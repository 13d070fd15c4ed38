import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { reachSummaryOfStored, type ArmReachSummary } from '../services/armReachSummary';

export class ArmModel extends Model<InferAttributes<ArmModel>, InferCreationAttributes<ArmModel>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare family: string;
  /** Parameters validated by shared/schemas/armModel.ts (lengths mm, angles degrees). */
  declare params: Record<string, unknown>;
  declare builtIn: CreationOptional<boolean>;
  /** Reach figures computed from `params` when the model is saved (null when they no longer parse). */
  declare reachSummary: CreationOptional<ArmReachSummary | null>;
  declare createdBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    ArmModel.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        name: { type: DataTypes.STRING(120), allowNull: false, unique: true },
        family: { type: DataTypes.STRING(20), allowNull: false },
        params: { type: DataTypes.JSONB, allowNull: false },
        builtIn: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        reachSummary: { type: DataTypes.JSONB, allowNull: true },
        createdBy: { type: DataTypes.INTEGER, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      {
        sequelize,
        tableName: 'arm_models',
        hooks: {
          // The routes compute the summary in the heavy-work pool and pass it; any other save of new
          // parameters (demo seed, scripts) gets it here, so a stored model always carries its own.
          beforeSave(m: ArmModel) {
            if ((m.isNewRecord || m.changed('params')) && !m.changed('reachSummary')) m.reachSummary = reachSummaryOfStored(m.params);
          },
        },
      },
    );
  }
}
