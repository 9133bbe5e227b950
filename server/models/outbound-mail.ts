import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { MailPurpose, MailStatus, OutboxAttachment } from '../../shared/api/outbox.js';

/**
 * One e-mail Shelfmatch tried to send: written before the SMTP conversation (`sending`) and
 * updated with its outcome (`sent` or `failed` with the error), so the Outbox shows every attempt.
 * Attachments are kept by name, type and size only, not their content.
 */
export class OutboundMail extends Model<InferAttributes<OutboundMail>, InferCreationAttributes<OutboundMail>> {
  declare id: CreationOptional<number>;
  /** Why it was sent: `invitation`, `password-reset`, `shortfall-list`. */
  declare purpose: MailPurpose;
  declare fromAddress: string;
  declare toAddresses: string[];
  declare subject: string;
  declare textBody: string;
  declare htmlBody: string | null;
  declare attachments: OutboxAttachment[];
  declare status: MailStatus;
  /** What the mail server (or the connection) said when sending failed. */
  declare error: string | null;
  /** The Message-ID header nodemailer gave the message. */
  declare messageId: string | null;
  /** Who caused the send; null for the system. */
  declare actorId: number | null;
  declare createdAt: CreationOptional<Date>;
  declare sentAt: Date | null;

  static initModel(sequelize: Sequelize): void {
    OutboundMail.init(
      {
        id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
        purpose: { type: DataTypes.STRING(32), allowNull: false },
        fromAddress: { type: DataTypes.STRING(320), allowNull: false, field: 'from_address' },
        toAddresses: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false, field: 'to_addresses' },
        subject: { type: DataTypes.STRING(400), allowNull: false },
        textBody: { type: DataTypes.TEXT, allowNull: false, field: 'text_body' },
        htmlBody: { type: DataTypes.TEXT, allowNull: true, field: 'html_body' },
        attachments: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        status: { type: DataTypes.STRING(16), allowNull: false },
        error: { type: DataTypes.TEXT, allowNull: true },
        messageId: { type: DataTypes.STRING(400), allowNull: true, field: 'message_id' },
        actorId: { type: DataTypes.INTEGER, allowNull: true, field: 'actor_id' },
        createdAt: { type: DataTypes.DATE, field: 'created_at' },
        sentAt: { type: DataTypes.DATE, allowNull: true, field: 'sent_at' },
      },
      { sequelize, tableName: 'outbound_mail', underscored: true, updatedAt: false },
    );
  }
}
