/**
 * A project's mail setting: from which severity new findings are e-mailed to its leads and
 * subscribers, and whether a fix on the base branch is e-mailed too. Columns `notifySeverity`
 * and `notifyOnFixed` of `projects` (migration 0003); defaults `error` and true. The project
 * settings page edits it with {@link setProjectNotify}. Raw SQL (quoted identifiers, boolean
 * parameters, portable between SQLite and PostgreSQL) because the Project model does not carry
 * these columns.
 */
import { QueryTypes, type Transaction } from 'sequelize';
import { z } from 'zod';
import { SEVERITIES, type Severity } from '../../lint/finding';
import { Project } from '../db/models';
import { NotFoundError } from '../errors';

/** When a project's builds send e-mail. */
export interface ProjectNotify {
  /** New findings at or above this severity (or a failed gate) send a regression e-mail. */
  severity: Severity;
  /** A build on the base branch that fixes findings at or above `severity` sends a "fixed" e-mail. */
  onFixed: boolean;
}

/** What a project starts with: errors only, fixes announced. */
export const PROJECT_NOTIFY_DEFAULTS: ProjectNotify = { severity: 'error', onFixed: true };

/**
 * The setting as a form sends it: `severity` and an optional checkbox `onFixed` (`on` when ticked).
 *
 * @example projectNotifySchema.parse({ severity: 'warning', onFixed: 'on' }) → { severity: 'warning', onFixed: true }
 */
export const projectNotifySchema = z.object({
  severity: z.enum(SEVERITIES, 'Choose error, warning or info.'),
  onFixed: z.preprocess(
    (value) => (typeof value === 'string' ? ['on', 'true', '1'].includes(value) : (value ?? false)),
    z.boolean('Tick the box or leave it empty.')
  )
});

interface NotifyRow {
  notifySeverity: Severity;
  notifyOnFixed: number | boolean;
}

/**
 * The project's setting.
 * @throws NotFoundError for an unknown project id.
 */
export async function getProjectNotify(projectId: number, transaction?: Transaction): Promise<ProjectNotify> {
  const rows = await sequelizeOf().query<NotifyRow>(
    'SELECT "notifySeverity", "notifyOnFixed" FROM "projects" WHERE "id" = ?',
    { replacements: [projectId], type: QueryTypes.SELECT, transaction }
  );
  if (rows.length === 0) throw new NotFoundError('project.not-found', `There is no project ${projectId}.`);
  return { severity: rows[0].notifySeverity, onFixed: Boolean(rows[0].notifyOnFixed) };
}

/** Saves the project's setting; later builds mail by it. */
export async function setProjectNotify(projectId: number, notify: ProjectNotify): Promise<void> {
  const parsed = projectNotifySchema.parse(notify);
  await sequelizeOf().query(
    'UPDATE "projects" SET "notifySeverity" = ?, "notifyOnFixed" = ?, "updatedAt" = ? WHERE "id" = ?',
    { replacements: [parsed.severity, parsed.onFixed, new Date(), projectId] }
  );
}

function sequelizeOf() {
  const sequelize = Project.sequelize;
  if (!sequelize) throw new Error('The Project model is not bound to a database; open the database first.');
  return sequelize;
}
