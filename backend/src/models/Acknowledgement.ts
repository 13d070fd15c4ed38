import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A client's receipt of a released revision: who and when. */
export class Acknowledgement extends Model<InferAttributes<Acknowledgement>, InferCreationAttributes<Acknowledgement>> {
  declare id: CreationOptional<number>;
  declare revisionId: number;
  declare userId: number;
  declare at: Date;

  static initModel(sequelize: Sequelize) {
    Acknowledgement.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        revisionId: { type: DataTypes.INTEGER, allowNull: false },
        userId: { type: DataTypes.INTEGER, allowNull: false },
        at: { type: DataTypes.DATE, allowNull: false },
      },
      { sequelize, tableName: 'acknowledgements', timestamps: false },
    );
  }
}
