/**
 * A person's own mail settings, as the profile page edits them: the preference (every build
 * e-mail, base branch only, none) and, per project they belong to, whether they get its build
 * e-mails. Leads always get them (unless the preference says none); others opt in per project
 * (column `isMailSubscribed` of `project_memberships`, migration 0003).
 */
import { QueryTypes } from 'sequelize';
import { z } from 'zod';
import { MAIL_PREFERENCES, type MailPreference } from '../db/models/user';
import { User } from '../db/models';
import { NotFoundError } from '../errors';
import type { ProjectRole } from '../../types/roles';

/** One project of the person, with their subscription. */
export interface ProjectMailSubscription {
  projectId: number;
  slug: string;
  name: string;
  role: ProjectRole;
  /** Leads get the project's e-mails without subscribing. */
  isLead: boolean;
  isSubscribed: boolean;
}

/** The person's mail settings. */
export interface MailSettings {
  preference: MailPreference;
  projects: ProjectMailSubscription[];
}

/**
 * The settings form: the preference and the ids of the projects ticked.
 *
 * @example mailSettingsSchema.parse({ preference: 'base', projectIds: ['3', '5'] }) → { preference: 'base', projectIds: [3, 5] }
 */
export const mailSettingsSchema = z.object({
  preference: z.enum(MAIL_PREFERENCES, 'Choose which build e-mails you want.'),
  projectIds: z.array(z.coerce.number().int().positive()).max(10_000)
});

/** What the person has chosen. @throws NotFoundError for an unknown user. */
export async function getMailSettings(userId: number): Promise<MailSettings> {
  const user = await User.findByPk(userId, { attributes: ['id', 'mailPreference'] });
  if (!user) throw new NotFoundError('user.not-found', `There is no user ${userId}.`);
  const rows = await sequelizeOf().query<{
    projectId: number;
    slug: string;
    name: string;
    role: ProjectRole;
    isMailSubscribed: number | boolean;
  }>(
    `SELECT p."id" AS "projectId", p."slug" AS "slug", p."name" AS "name", m."role" AS "role",
            m."isMailSubscribed" AS "isMailSubscribed"
       FROM "project_memberships" m JOIN "projects" p ON p."id" = m."projectId"
      WHERE m."userId" = ? ORDER BY p."name"`,
    { replacements: [userId], type: QueryTypes.SELECT }
  );
  return {
    preference: user.mailPreference,
    projects: rows.map((row) => ({
      projectId: row.projectId,
      slug: row.slug,
      name: row.name,
      role: row.role,
      isLead: row.role === 'lead',
      isSubscribed: row.role === 'lead' || Boolean(row.isMailSubscribed)
    }))
  };
}

/** Saves the preference and subscribes the person to exactly the listed projects they are a member of. */
export async function saveMailSettings(userId: number, settings: z.output<typeof mailSettingsSchema>): Promise<void> {
  const sequelize = sequelizeOf();
  await sequelize.transaction(async (transaction) => {
    await User.update({ mailPreference: settings.preference }, { where: { id: userId }, transaction });
    await sequelize.query(
      'UPDATE "project_memberships" SET "isMailSubscribed" = ?, "updatedAt" = ? WHERE "userId" = ?',
      {
        replacements: [false, new Date(), userId],
        transaction
      }
    );
    if (settings.projectIds.length > 0) {
      await sequelize.query(
        'UPDATE "project_memberships" SET "isMailSubscribed" = ?, "updatedAt" = ? WHERE "userId" = ? AND "projectId" IN (?)',
        { replacements: [true, new Date(), userId, settings.projectIds], transaction }
      );
    }
  });
}

function sequelizeOf() {
  const sequelize = User.sequelize;
  if (!sequelize) throw new Error('The User model is not bound to a database; open the database first.');
  return sequelize;
}
