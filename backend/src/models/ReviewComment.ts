import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A reviewer's (or planner's) comment on a revision, pinned to a finding id or a plan point (mm). */
export class ReviewComment extends Model<InferAttributes<ReviewComment>, InferCreationAttributes<ReviewComment>> {
  declare id: CreationOptional<number>;
  declare revisionId: number;
  declare authorId: number | null;
  declare findingId: string | null;
  declare pointX: number | null;
  declare pointY: number | null;
  declare body: string;
  declare resolved: CreationOptional<boolean>;
  declare resolvedBy: CreationOptional<number | null>;
  declare resolvedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    ReviewComment.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        revisionId: { type: DataTypes.INTEGER, allowNull: false },
        authorId: { type: DataTypes.INTEGER, allowNull: true },
        findingId: { type: DataTypes.STRING(200), allowNull: true },
        pointX: { type: DataTypes.DOUBLE, allowNull: true },
        pointY: { type: DataTypes.DOUBLE, allowNull: true },
        body: { type: DataTypes.TEXT, allowNull: false },
        resolved: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        resolvedBy: { type: DataTypes.INTEGER, allowNull: true },
        resolvedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'review_comments' },
    );
  }
}
