import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export class ProjectMember extends Model<InferAttributes<ProjectMember>, InferCreationAttributes<ProjectMember>> {
  declare projectId: number;
  declare userId: number;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    ProjectMember.init(
      {
        projectId: { type: DataTypes.INTEGER, primaryKey: true },
        userId: { type: DataTypes.INTEGER, primaryKey: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'project_members', updatedAt: false },
    );
  }
}
