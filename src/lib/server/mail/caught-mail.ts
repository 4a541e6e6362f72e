/**
 * A message the local mail catcher received (table `caught_mails`, migration 0003): what the
 * mail outbox screen shows when no SMTP server is configured, so a team can read the e-mails
 * Orientry sends without a mail server. Stored in the database, so every server process sharing
 * it (each with its own catcher) shows the same list.
 */
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize
} from 'sequelize';
import { getDatabase } from '../db/instance';
import { MailMessage } from '../db/models';

/** A row of `caught_mails`. */
export class CaughtMail extends Model<InferAttributes<CaughtMail>, InferCreationAttributes<CaughtMail>> {
  declare id: CreationOptional<number>;
  /** Message-ID without angle brackets; null when the message had none. */
  declare messageId: string | null;
  declare envelopeFrom: string | null;
  /** Envelope recipients as a JSON array. */
  declare envelopeTo: string;
  declare subject: string;
  declare fromText: string;
  declare toText: string;
  /** The header section as received. */
  declare headersText: string;
  declare textBody: string | null;
  declare htmlBody: string | null;
  declare byteLength: number;
  declare receivedAt: Date;

  /** Binds the model to a Sequelize instance (columns mirror migration 0003). */
  static initModel(sequelize: Sequelize): typeof CaughtMail {
    CaughtMail.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        messageId: { type: DataTypes.STRING(998), allowNull: true },
        envelopeFrom: { type: DataTypes.STRING(320), allowNull: true },
        envelopeTo: { type: DataTypes.TEXT, allowNull: false },
        subject: { type: DataTypes.STRING(998), allowNull: false },
        fromText: { type: DataTypes.STRING(998), allowNull: false },
        toText: { type: DataTypes.TEXT, allowNull: false },
        headersText: { type: DataTypes.TEXT, allowNull: false },
        textBody: { type: DataTypes.TEXT, allowNull: true },
        htmlBody: { type: DataTypes.TEXT, allowNull: true },
        byteLength: { type: DataTypes.INTEGER, allowNull: false, validate: { min: 0 } },
        receivedAt: { type: DataTypes.DATE, allowNull: false }
      },
      { sequelize, tableName: 'caught_mails', timestamps: false }
    );
    return CaughtMail;
  }
}

/**
 * The model, bound to the same database as the shared models. Those are bound when a database is
 * opened; this one binds on first use, and again after another database was opened (tests, scripts).
 */
export function caughtMails(): typeof CaughtMail {
  const sequelize = MailMessage.sequelize ?? getDatabase().sequelize;
  if (CaughtMail.sequelize !== sequelize) CaughtMail.initModel(sequelize);
  return CaughtMail;
}
