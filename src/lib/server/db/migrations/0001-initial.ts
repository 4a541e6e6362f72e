/**
 * Migration 0001: the first schema (users, projects, memberships, tokens, policies, builds,
 * assets, findings, waivers and their history, mail outbox, invitations) with its indexes.
 * Foreign keys: rows that belong to a project or build are deleted with it (CASCADE); references
 * to people and to optional builds or waivers become NULL (SET NULL), so history outlives them.
 */
import { DataTypes, type QueryInterface } from 'sequelize';
import { columnTypes, POSTGRES_JSON_CHECK_FUNCTION, quoted } from './column-types';

export const name = '0001-initial';

const id = { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true, allowNull: false };
const timestamp = { type: DataTypes.DATE, allowNull: false };
const optionalDate = { type: DataTypes.DATE, allowNull: true };

function owner(table: string, allowNull = false) {
  return {
    type: DataTypes.INTEGER,
    allowNull,
    references: { model: table, key: 'id' },
    onDelete: allowNull ? 'SET NULL' : 'CASCADE'
  };
}

const severities = ['error', 'warning', 'info'];
const userRoles = ['admin', 'lead', 'artist', 'viewer'];
const projectRoles = ['lead', 'artist', 'viewer'];

/** Creates every table and index of the first schema. */
export async function up(queryInterface: QueryInterface): Promise<void> {
  const { checked, oneOf, onlyCharacters, startsWithCharacter, isJson } = columnTypes(queryInterface);
  /** A non-negative counter starting at 0. */
  const countColumn = (column: string) => ({
    type: checked('INTEGER', `${quoted(column)} >= 0`),
    allowNull: false,
    defaultValue: 0
  });
  const sha256Hex = (column: string) =>
    checked('CHAR(64)', `length(${quoted(column)}) = 64 AND ${onlyCharacters(column, '0-9a-f')}`);
  if (queryInterface.sequelize.getDialect() === 'postgres') await createJsonCheckFunction(queryInterface);

  await queryInterface.createTable('users', {
    id,
    email: {
      type: checked('VARCHAR(320)', `"email" = lower(trim("email")) AND "email" LIKE '%_@_%'`),
      allowNull: false,
      unique: true
    },
    name: { type: DataTypes.STRING(200), allowNull: false },
    passwordHash: { type: DataTypes.STRING(100), allowNull: false },
    role: { type: oneOf('role', userRoles), allowNull: false, defaultValue: 'viewer' },
    mailPreference: {
      type: oneOf('mailPreference', ['all', 'base', 'none'], 8),
      allowNull: false,
      defaultValue: 'all'
    },
    disabledAt: optionalDate,
    createdAt: timestamp,
    updatedAt: timestamp
  });

  await queryInterface.createTable('projects', {
    id,
    slug: {
      // The same rule as PROJECT_SLUG_PATTERN, /^[a-z0-9][a-z0-9-]{1,62}$/.
      type: checked(
        'VARCHAR(63)',
        `length("slug") BETWEEN 2 AND 63 AND ${startsWithCharacter('slug', 'a-z0-9')} AND ` +
          onlyCharacters('slug', 'a-z0-9-')
      ),
      allowNull: false,
      unique: true
    },
    name: { type: DataTypes.STRING(200), allowNull: false },
    baseBranch: { type: checked('VARCHAR(255)', `"baseBranch" <> ''`), allowNull: false, defaultValue: 'main' },
    createdAt: timestamp,
    updatedAt: timestamp
  });

  await queryInterface.createTable('project_memberships', {
    id,
    projectId: owner('projects'),
    userId: owner('users'),
    role: { type: oneOf('role', projectRoles), allowNull: false },
    createdAt: timestamp,
    updatedAt: timestamp
  });
  await queryInterface.addIndex('project_memberships', ['projectId', 'userId'], {
    name: 'project_memberships_project_user',
    unique: true
  });
  await queryInterface.addIndex('project_memberships', ['userId'], { name: 'project_memberships_user' });

  await queryInterface.createTable('api_tokens', {
    id,
    projectId: owner('projects'),
    name: { type: DataTypes.STRING(100), allowNull: false },
    tokenHash: { type: sha256Hex('tokenHash'), allowNull: false, unique: true },
    prefix: { type: DataTypes.STRING(16), allowNull: false },
    scopes: { type: DataTypes.STRING(100), allowNull: false, defaultValue: 'submit' },
    createdById: owner('users', true),
    lastUsedAt: optionalDate,
    revokedAt: optionalDate,
    createdAt: timestamp,
    updatedAt: timestamp
  });
  await queryInterface.addIndex('api_tokens', ['projectId'], { name: 'api_tokens_project' });

  await queryInterface.createTable('project_policies', {
    id,
    projectId: owner('projects'),
    revision: { type: checked('INTEGER', '"revision" >= 1'), allowNull: false },
    policyJson: { type: checked('TEXT', isJson('policyJson')), allowNull: false },
    policyVersion: { type: DataTypes.STRING(32), allowNull: false },
    createdById: owner('users', true),
    createdAt: timestamp
  });
  await queryInterface.addIndex('project_policies', ['projectId', 'revision'], {
    name: 'project_policies_project_revision',
    unique: true
  });

  await queryInterface.createTable('builds', {
    id,
    projectId: owner('projects'),
    branch: { type: checked('VARCHAR(255)', `"branch" <> ''`), allowNull: false },
    commitSha: { type: DataTypes.STRING(64), allowNull: true },
    label: { type: DataTypes.STRING(200), allowNull: true },
    ciJobUrl: { type: DataTypes.STRING(2048), allowNull: true },
    idempotencyKey: { type: DataTypes.STRING(200), allowNull: true },
    verdict: { type: oneOf('verdict', ['pass', 'fail'], 8), allowNull: false },
    verdictReason: { type: DataTypes.TEXT, allowNull: true },
    baselineBuildId: owner('builds', true),
    policyVersion: { type: DataTypes.STRING(32), allowNull: false },
    engineVersion: { type: DataTypes.STRING(32), allowNull: false },
    errorCount: countColumn('errorCount'),
    warningCount: countColumn('warningCount'),
    infoCount: countColumn('infoCount'),
    newCount: countColumn('newCount'),
    unchangedCount: countColumn('unchangedCount'),
    fixedCount: countColumn('fixedCount'),
    waivedCount: countColumn('waivedCount'),
    assetCount: countColumn('assetCount'),
    durationMs: { type: DataTypes.INTEGER, allowNull: true },
    createdAt: timestamp
  });
  await queryInterface.addIndex('builds', ['projectId', 'branch', 'createdAt'], {
    name: 'builds_project_branch_created'
  });
  await queryInterface.addIndex('builds', ['projectId', 'createdAt'], { name: 'builds_project_created' });
  await queryInterface.addIndex('builds', ['projectId', 'idempotencyKey'], {
    name: 'builds_project_idempotency_key',
    unique: true
  });
  await queryInterface.addIndex('builds', ['baselineBuildId'], { name: 'builds_baseline' });

  await queryInterface.createTable('assets', {
    id,
    buildId: owner('builds'),
    path: { type: checked('VARCHAR(1024)', `"path" <> ''`), allowNull: false },
    contentHash: { type: sha256Hex('contentHash'), allowNull: false },
    byteLength: { type: checked('INTEGER', '"byteLength" >= 0'), allowNull: false },
    policyVersion: { type: DataTypes.STRING(32), allowNull: false },
    unreadable: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    statsJson: { type: DataTypes.TEXT, allowNull: true },
    errorCount: countColumn('errorCount'),
    warningCount: countColumn('warningCount'),
    infoCount: countColumn('infoCount'),
    worstRule: { type: DataTypes.STRING(64), allowNull: true }
  });
  await queryInterface.addIndex('assets', ['buildId', 'path'], { name: 'assets_build_path', unique: true });
  await queryInterface.addIndex('assets', ['contentHash', 'policyVersion'], { name: 'assets_content_policy' });

  await queryInterface.createTable('waivers', {
    id,
    projectId: owner('projects'),
    scope: {
      type: checked(
        oneOf('scope', ['fingerprint', 'rule-asset']),
        `("scope" = 'fingerprint' AND "fingerprint" IS NOT NULL) OR ` +
          `("scope" = 'rule-asset' AND "rule" IS NOT NULL AND "assetPath" IS NOT NULL)`
      ),
      allowNull: false
    },
    fingerprint: { type: DataTypes.STRING(32), allowNull: true },
    rule: { type: DataTypes.STRING(64), allowNull: true },
    assetPath: { type: DataTypes.STRING(1024), allowNull: true },
    reason: { type: checked('TEXT', `"reason" <> ''`), allowNull: false },
    expiresAt: optionalDate,
    status: {
      type: oneOf('status', ['proposed', 'approved', 'rejected', 'revoked'], 10),
      allowNull: false,
      defaultValue: 'proposed'
    },
    proposedById: owner('users', true),
    decidedById: owner('users', true),
    decidedAt: optionalDate,
    createdAt: timestamp,
    updatedAt: timestamp
  });
  await queryInterface.addIndex('waivers', ['projectId', 'fingerprint'], { name: 'waivers_project_fingerprint' });
  await queryInterface.addIndex('waivers', ['projectId', 'rule', 'assetPath'], { name: 'waivers_project_rule_asset' });

  await queryInterface.createTable('findings', {
    id,
    buildId: owner('builds'),
    assetId: owner('assets', true),
    assetPath: { type: DataTypes.STRING(1024), allowNull: false },
    rule: { type: DataTypes.STRING(64), allowNull: false },
    severity: { type: oneOf('severity', severities, 8), allowNull: false },
    status: { type: oneOf('status', ['new', 'unchanged', 'fixed'], 10), allowNull: false },
    waived: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    waiverId: owner('waivers', true),
    animation: { type: DataTypes.STRING(255), allowNull: true },
    channel: { type: DataTypes.INTEGER, allowNull: true },
    node: { type: DataTypes.STRING(1024), allowNull: true },
    keyFirst: { type: DataTypes.INTEGER, allowNull: true },
    keyLast: {
      type: checked('INTEGER', '"keyLast" IS NULL OR "keyFirst" IS NULL OR "keyLast" >= "keyFirst"'),
      allowNull: true
    },
    timeSeconds: { type: DataTypes.DOUBLE, allowNull: true },
    valuesJson: { type: DataTypes.TEXT, allowNull: true },
    message: { type: DataTypes.TEXT, allowNull: false },
    hint: { type: DataTypes.TEXT, allowNull: false },
    fingerprint: { type: DataTypes.STRING(32), allowNull: false }
  });
  await queryInterface.addIndex('findings', ['buildId', 'severity'], { name: 'findings_build_severity' });
  await queryInterface.addIndex('findings', ['buildId', 'assetId'], { name: 'findings_build_asset' });
  await queryInterface.addIndex('findings', ['assetId'], { name: 'findings_asset' });
  await queryInterface.addIndex('findings', ['fingerprint'], { name: 'findings_fingerprint' });
  await queryInterface.addIndex('findings', ['waiverId'], { name: 'findings_waiver' });

  await queryInterface.createTable('waiver_events', {
    id,
    waiverId: owner('waivers'),
    userId: owner('users', true),
    action: {
      type: oneOf('action', ['proposed', 'approved', 'rejected', 'revoked', 'expired', 'commented'], 10),
      allowNull: false
    },
    note: { type: DataTypes.TEXT, allowNull: true },
    createdAt: timestamp
  });
  await queryInterface.addIndex('waiver_events', ['waiverId', 'createdAt'], { name: 'waiver_events_waiver_created' });

  await queryInterface.createTable('mail_messages', {
    id,
    kind: { type: DataTypes.STRING(64), allowNull: false },
    toAddress: { type: DataTypes.STRING(320), allowNull: false },
    subject: { type: DataTypes.STRING(998), allowNull: false },
    textBody: { type: DataTypes.TEXT, allowNull: false },
    htmlBody: { type: DataTypes.TEXT, allowNull: true },
    headersJson: { type: DataTypes.TEXT, allowNull: true },
    buildId: owner('builds', true),
    dedupeKey: { type: DataTypes.STRING(255), allowNull: false, unique: true },
    status: {
      type: oneOf('status', ['queued', 'sending', 'sent', 'failed'], 8),
      allowNull: false,
      defaultValue: 'queued'
    },
    attempts: { ...countColumn('attempts') },
    nextAttemptAt: timestamp,
    lastError: { type: DataTypes.TEXT, allowNull: true },
    leaseOwner: { type: DataTypes.STRING(100), allowNull: true },
    leaseUntil: optionalDate,
    sentAt: optionalDate,
    createdAt: timestamp,
    updatedAt: timestamp
  });
  await queryInterface.addIndex('mail_messages', ['status', 'nextAttemptAt'], {
    name: 'mail_messages_status_next_attempt'
  });
  await queryInterface.addIndex('mail_messages', ['buildId'], { name: 'mail_messages_build' });

  await queryInterface.createTable('invitations', {
    id,
    email: { type: checked('VARCHAR(320)', '"email" = lower(trim("email"))'), allowNull: false },
    role: { type: oneOf('role', userRoles), allowNull: false },
    tokenHash: { type: sha256Hex('tokenHash'), allowNull: false, unique: true },
    invitedById: owner('users', true),
    expiresAt: timestamp,
    acceptedAt: optionalDate,
    createdAt: timestamp
  });
  await queryInterface.addIndex('invitations', ['email'], { name: 'invitations_email' });
}

/** Drops everything `up` created, children first. */
export async function down(queryInterface: QueryInterface): Promise<void> {
  for (const table of [
    'invitations',
    'mail_messages',
    'waiver_events',
    'findings',
    'waivers',
    'assets',
    'builds',
    'project_policies',
    'api_tokens',
    'project_memberships',
    'projects',
    'users'
  ]) {
    await queryInterface.dropTable(table);
  }
  if (queryInterface.sequelize.getDialect() === 'postgres') {
    await queryInterface.sequelize.query(`DROP FUNCTION IF EXISTS ${POSTGRES_JSON_CHECK_FUNCTION}(text)`);
  }
}

/**
 * PostgreSQL 15 has no `IS JSON` (16 does) and a CHECK cannot catch a failed cast, so a small
 * function tries the cast and answers false instead of raising.
 */
async function createJsonCheckFunction(queryInterface: QueryInterface): Promise<void> {
  await queryInterface.sequelize.query(
    `CREATE OR REPLACE FUNCTION ${POSTGRES_JSON_CHECK_FUNCTION}(candidate text) RETURNS boolean ` +
      'LANGUAGE plpgsql IMMUTABLE AS $body$ BEGIN PERFORM candidate::json; RETURN true; ' +
      'EXCEPTION WHEN others THEN RETURN false; END $body$'
  );
}
