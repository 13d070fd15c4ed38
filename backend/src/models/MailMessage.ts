import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export interface MailAttachmentMeta {
  filename: string;
  contentType: string;
  size: number;
  /** sha256 of the attachment bytes, hex. */
  checksum: string;
}

/** A message captured by the local mail fake (the SMTP server npm start runs when SMTP_URL is unset). */
export class MailMessage extends Model<InferAttributes<MailMessage>, InferCreationAttributes<MailMessage>> {
  declare id: CreationOptional<number>;
  declare from: string;
  declare to: string[];
  declare subject: string;
  declare text: string;
  declare attachments: MailAttachmentMeta[];
  /** The whole message as it travelled over SMTP (RFC 5322). */
  declare raw: Buffer;
  declare at: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    MailMessage.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        from: { type: DataTypes.STRING(320), allowNull: false, defaultValue: '' },
        to: { type: DataTypes.JSONB, allowNull: false },
        subject: { type: DataTypes.STRING(500), allowNull: false, defaultValue: '' },
        text: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        attachments: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        raw: { type: DataTypes.BLOB, allowNull: false },
        at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { sequelize, tableName: 'mail_messages', timestamps: false },
    );
  }
}
