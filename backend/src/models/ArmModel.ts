import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export class ArmModel extends Model<InferAttributes<ArmModel>, InferCreationAttributes<ArmModel>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare family: string;
  /** Parameters validated by shared/schemas/armModel.ts (lengths mm, angles degrees). */
  declare params: Record<string, unknown>;
  declare builtIn: CreationOptional<boolean>;
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
        createdBy: { type: DataTypes.INTEGER, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'arm_models' },
    );
  }
}
