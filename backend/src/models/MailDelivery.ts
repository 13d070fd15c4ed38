import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export type MailDeliveryStatus = 'pending' | 'sent' | 'failed';

/** One outgoing e-mail the product owes someone, with its delivery state (retried when it failed). */
export class MailDelivery extends Model<InferAttributes<MailDelivery>, InferCreationAttributes<MailDelivery>> {
  declare id: CreationOptional<number>;
  /** release | submitted | decided | invitation */
  declare kind: string;
  declare revisionId: number | null;
  declare to: string[];
  declare subject: string;
  declare status: MailDeliveryStatus;
  declare error: CreationOptional<string | null>;
  declare attempts: CreationOptional<number>;
  declare lastAttemptAt: CreationOptional<Date | null>;
  declare createdAt: Date;

  static initModel(sequelize: Sequelize) {
    MailDelivery.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        kind: { type: DataTypes.STRING(32), allowNull: false },
        revisionId: { type: DataTypes.INTEGER, allowNull: true },
        to: { type: DataTypes.JSONB, allowNull: false },
        subject: { type: DataTypes.STRING(500), allowNull: false },
        status: { type: DataTypes.STRING(16), allowNull: false },
        error: { type: DataTypes.TEXT, allowNull: true },
        attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        lastAttemptAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: { type: DataTypes.DATE, allowNull: false },
      },
      { sequelize, tableName: 'mail_deliveries', timestamps: false },
    );
  }
}
