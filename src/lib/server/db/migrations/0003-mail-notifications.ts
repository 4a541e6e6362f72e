/**
 * Migration 0003: what build e-mails need. Each project says from which severity new findings
 * are mailed and whether fixes on the base branch are mailed too; members other than leads opt in
 * to a project's mail; and `caught_mails` keeps every message the local mail catcher received
 * (the server catches its own mail when no SMTP server is configured).
 */
import { DataTypes, type QueryInterface } from 'sequelize';
import { columnTypes, quoted } from './column-types';

/** Name recorded in the migration table once applied. */
export const name = '0003-mail-notifications';

/** Adds the notification columns and creates `caught_mails`. */
export async function up(queryInterface: QueryInterface): Promise<void> {
  const { checked, oneOf } = columnTypes(queryInterface);
  await queryInterface.addColumn('projects', 'notifySeverity', {
    type: oneOf('notifySeverity', ['error', 'warning', 'info'], 8),
    allowNull: false,
    defaultValue: 'error'
  });
  await queryInterface.addColumn('projects', 'notifyOnFixed', {
    type: DataTypes.BOOLEAN,
    allowNull: false,
    defaultValue: true
  });
  await queryInterface.addColumn('project_memberships', 'isMailSubscribed', {
    type: DataTypes.BOOLEAN,
    allowNull: false,
    defaultValue: false
  });

  await queryInterface.createTable('caught_mails', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true, allowNull: false },
    /** The Message-ID header without angle brackets, when the message had one. */
    messageId: { type: DataTypes.STRING(998), allowNull: true },
    envelopeFrom: { type: DataTypes.STRING(320), allowNull: true },
    /** Envelope recipients as a JSON array of addresses. */
    envelopeTo: { type: DataTypes.TEXT, allowNull: false },
    subject: { type: DataTypes.STRING(998), allowNull: false, defaultValue: '' },
    fromText: { type: DataTypes.STRING(998), allowNull: false, defaultValue: '' },
    toText: { type: DataTypes.TEXT, allowNull: false },
    /** The header section exactly as received (unfolded lines kept as sent). */
    headersText: { type: DataTypes.TEXT, allowNull: false },
    textBody: { type: DataTypes.TEXT, allowNull: true },
    htmlBody: { type: DataTypes.TEXT, allowNull: true },
    byteLength: { type: checked('INTEGER', '"byteLength" >= 0'), allowNull: false },
    receivedAt: { type: DataTypes.DATE, allowNull: false }
  });
  await queryInterface.addIndex('caught_mails', ['receivedAt'], { name: 'caught_mails_received' });
  await queryInterface.addIndex('caught_mails', ['messageId'], { name: 'caught_mails_message_id' });
}

/** Drops `caught_mails` and the added columns (SQLite 3.35+ drops a column in place). */
export async function down(queryInterface: QueryInterface): Promise<void> {
  await queryInterface.dropTable('caught_mails');
  // Raw DROP COLUMN: Sequelize's removeColumn rebuilds SQLite tables and would lose their CHECKs.
  for (const [table, column] of [
    ['project_memberships', 'isMailSubscribed'],
    ['projects', 'notifyOnFixed'],
    ['projects', 'notifySeverity']
  ]) {
    await queryInterface.sequelize.query(`ALTER TABLE ${quoted(table)} DROP COLUMN ${quoted(column)}`);
  }
}
