/**
 * Who gets a project's build e-mails: its leads, and members who subscribed, minus anyone whose
 * account is disabled or whose mail preference rules the build out (`none`, or `base` for a build
 * on another branch than the base branch). Admins are not mailed for projects they are not in.
 * Raw SQL because the membership model does not carry the opt-in column; quoted identifiers and
 * boolean parameters keep it portable between SQLite and PostgreSQL.
 */
import { QueryTypes, type Transaction } from 'sequelize';
import { ProjectMembership } from '../db/models';

/** One person to mail, and why. */
export interface BuildMailRecipient {
  userId: number;
  email: string;
  name: string;
  reason: 'lead' | 'subscribed';
}

/** The recipients of a build e-mail of `projectId`, by user id. */
export async function listBuildMailRecipients(
  projectId: number,
  isBaseBranch: boolean,
  transaction?: Transaction
): Promise<BuildMailRecipient[]> {
  const sequelize = ProjectMembership.sequelize;
  if (!sequelize) throw new Error('The models are not bound to a database; open the database first.');
  const rows = await sequelize.query<{ userId: number; email: string; name: string; role: string }>(
    `SELECT u."id" AS "userId", u."email" AS "email", u."name" AS "name", m."role" AS "role"
       FROM "project_memberships" m JOIN "users" u ON u."id" = m."userId"
      WHERE m."projectId" = :projectId
        AND u."disabledAt" IS NULL
        AND (m."role" = 'lead' OR m."isMailSubscribed" = :isSubscribed)
        AND (u."mailPreference" = 'all' OR (u."mailPreference" = 'base' AND :isBaseBranch))
      ORDER BY u."id"`,
    { replacements: { projectId, isSubscribed: true, isBaseBranch }, type: QueryTypes.SELECT, transaction }
  );
  return rows.map((row) => ({
    userId: row.userId,
    email: row.email,
    name: row.name,
    reason: row.role === 'lead' ? 'lead' : 'subscribed'
  }));
}
