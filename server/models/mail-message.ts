import { type CreationOptional, DataTypes, type InferAttributes, type InferCreationAttributes, Model, type Sequelize } from 'sequelize';
import { jsonColumn } from './json';

/** An attachment as the mail catcher saw it: its file name, type and decoded size. */
export interface MailAttachmentInfo {
  fileName: string;
  contentType: string;
  sizeBytes: number;
}

/** A message the local mail catcher received (it delivers nothing further). */
export class MailMessage extends Model<InferAttributes<MailMessage>, InferCreationAttributes<MailMessage>> {
  declare id: CreationOptional<number>;
  declare receivedAt: Date;
  declare envelopeFrom: string;
  declare envelopeTo: string[];
  declare subject: string;
  declare text: string;
  declare attachments: MailAttachmentInfo[];
  declare sizeBytes: number;

  toDto() {
    return {
      id: this.id,
      receivedAt: this.receivedAt.toISOString(),
      from: this.envelopeFrom,
      to: this.envelopeTo,
      subject: this.subject,
      text: this.text,
      attachments: this.attachments,
      sizeBytes: this.sizeBytes,
    };
  }

  static initModel(sequelize: Sequelize) {
    MailMessage.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        receivedAt: { type: DataTypes.DATE(3), allowNull: false },
        envelopeFrom: { type: DataTypes.STRING(320), allowNull: false },
        envelopeTo: jsonColumn('envelopeTo'),
        subject: { type: DataTypes.STRING(500), allowNull: false },
        text: { type: DataTypes.TEXT, allowNull: false },
        attachments: jsonColumn('attachments'),
        sizeBytes: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      },
      { sequelize, tableName: 'mail_messages', timestamps: false },
    );
  }
}
