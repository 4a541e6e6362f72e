import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize
} from 'sequelize';

/** Outbox states: `sending` is held under a lease so two workers never send the same message. */
export const MAIL_STATUSES = ['queued', 'sending', 'sent', 'failed'] as const;
export type MailStatus = (typeof MAIL_STATUSES)[number];

/**
 * A message in the mail outbox. Requests only enqueue; a worker leases due messages
 * (`leaseOwner`, `leaseUntil`), sends them and retries with back-off (`attempts`, `nextAttemptAt`).
 * `dedupeKey` is unique, so enqueueing the same notice twice keeps one message.
 */
export class MailMessage extends Model<InferAttributes<MailMessage>, InferCreationAttributes<MailMessage>> {
  declare id: CreationOptional<number>;
  /** What the message is about, e.g. `build-failed`, `invitation`. */
  declare kind: string;
  declare toAddress: string;
  declare subject: string;
  declare textBody: string;
  declare htmlBody: string | null;
  /** Extra headers as a JSON object text. */
  declare headersJson: string | null;
  declare buildId: number | null;
  declare dedupeKey: string;
  declare status: CreationOptional<MailStatus>;
  declare attempts: CreationOptional<number>;
  declare nextAttemptAt: CreationOptional<Date>;
  declare lastError: CreationOptional<string | null>;
  declare leaseOwner: CreationOptional<string | null>;
  declare leaseUntil: CreationOptional<Date | null>;
  declare sentAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  /** Binds the model to a Sequelize instance (columns mirror migration 0001). */
  static initModel(sequelize: Sequelize): typeof MailMessage {
    MailMessage.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        kind: { type: DataTypes.STRING(64), allowNull: false },
        toAddress: { type: DataTypes.STRING(320), allowNull: false },
        subject: { type: DataTypes.STRING(998), allowNull: false },
        textBody: { type: DataTypes.TEXT, allowNull: false },
        htmlBody: { type: DataTypes.TEXT, allowNull: true },
        headersJson: { type: DataTypes.TEXT, allowNull: true },
        buildId: { type: DataTypes.INTEGER, allowNull: true },
        dedupeKey: { type: DataTypes.STRING(255), allowNull: false, unique: true },
        status: {
          type: DataTypes.STRING(8),
          allowNull: false,
          defaultValue: 'queued',
          validate: { isIn: [MAIL_STATUSES] }
        },
        attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0, validate: { min: 0 } },
        nextAttemptAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        lastError: { type: DataTypes.TEXT, allowNull: true },
        leaseOwner: { type: DataTypes.STRING(100), allowNull: true },
        leaseUntil: { type: DataTypes.DATE, allowNull: true },
        sentAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE
      },
      { sequelize, tableName: 'mail_messages' }
    );
    return MailMessage;
  }
}
