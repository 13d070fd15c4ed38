import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize';
import type { ProjectDto } from '@shared/schemas/project';
import type { User } from './User';

export class Project extends Model<InferAttributes<Project>, InferCreationAttributes<Project>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare clientName: string;
  declare siteName: CreationOptional<string>;
  declare description: CreationOptional<string>;
  declare createdBy: number | null;
  /** Set while archived: hidden from lists, read-only, restorable by an admin. */
  declare archivedAt: CreationOptional<Date | null>;
  declare archivedBy: CreationOptional<number | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare creator?: NonAttribute<User | null>;
  declare members?: NonAttribute<User[]>;

  static initModel(sequelize: Sequelize) {
    Project.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        name: { type: DataTypes.STRING(160), allowNull: false },
        clientName: { type: DataTypes.STRING(160), allowNull: false },
        siteName: { type: DataTypes.STRING(160), allowNull: false, defaultValue: '' },
        description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        createdBy: { type: DataTypes.INTEGER, allowNull: true },
        archivedAt: { type: DataTypes.DATE, allowNull: true },
        archivedBy: { type: DataTypes.INTEGER, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'projects' },
    );
  }
}

/** Public shape of a project; memberCount given by the caller's query. */
export function presentProject(p: Project, memberCount: number): ProjectDto {
  return {
    id: p.id,
    name: p.name,
    clientName: p.clientName,
    siteName: p.siteName,
    description: p.description,
    createdAt: p.createdAt.toISOString(),
    updatedAt: p.updatedAt.toISOString(),
    createdBy: p.creator ? { id: p.creator.id, name: p.creator.name } : null,
    memberCount,
    archivedAt: p.archivedAt ? p.archivedAt.toISOString() : null,
  };
}
