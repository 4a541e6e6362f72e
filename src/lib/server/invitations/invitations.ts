/**
 * Invitations: how a new person gets an account. An admin invites an e-mail address with a
 * role; the link `/invite/<token>` lets its owner set a name and password once, before it
 * expires. Only the SHA-256 of the token is stored, so the link is shown once at creation, and
 * e-mailed through the mail outbox when the caller names the link's origin. Import as a
 * namespace: `invitations.create(...)`.
 */
import crypto from 'node:crypto';
import type { Transaction } from 'sequelize';
import { z } from 'zod';
import { USER_ROLES, type UserRole } from '../../types/roles';
import { hashPassword } from '../auth/password';
import { Invitation, User } from '../db/models';
import { InputError } from '../errors';
import { queueInvitationMail } from '../mail/invitation-mail';

/** How long a link stays valid: a week covers a holiday weekend without leaving links around for months. */
export const INVITATION_LIFETIME_MS = 7 * 24 * 60 * 60 * 1000;

/** Shortest password accepted when setting one. */
export const PASSWORD_MIN_LENGTH = 10;

const TOKEN_PATTERN = /^inv_[A-Za-z0-9_-]{43}$/;

/** Inviting someone: their address and site-wide role. */
export const inviteSchema = z.object({
  email: z
    .string('Enter the e-mail address to invite.')
    .trim()
    .toLowerCase()
    .pipe(z.email('Enter an e-mail address such as name@studio.example.')),
  role: z.enum(USER_ROLES, 'Choose admin, lead, artist or viewer.')
});

/** Accepting: the new account's name and password (typed twice). */
export const acceptSchema = z
  .object({
    name: z
      .string('Enter your name as teammates know it.')
      .trim()
      .min(1, 'Enter your name as teammates know it.')
      .max(200, 'Keep the name under 200 characters.'),
    password: z
      .string('Choose a password.')
      .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters.`)
      .max(1000, 'Keep the password under 1000 characters.'),
    passwordAgain: z.string('Type the password again.')
  })
  .refine((input) => input.password === input.passwordAgain, {
    path: ['passwordAgain'],
    message: 'The two passwords differ; type the same one twice.'
  });

/** A new invitation with its one-time token. */
export interface CreatedInvitation {
  id: number;
  email: string;
  role: UserRole;
  expiresAt: string;
  /** The secret part of the link; never stored, never shown again. */
  token: string;
}

/** An invitation as the admin page lists it. */
export interface InvitationView {
  id: number;
  email: string;
  role: UserRole;
  invitedBy: string | null;
  createdAt: string;
  expiresAt: string;
  acceptedAt: string | null;
  state: InvitationState;
}

/** Where an invitation stands: usable, used, or past its time. */
export type InvitationState = 'pending' | 'accepted' | 'expired';

/** What a visitor of `/invite/<token>` is told. */
export type InvitationLookup =
  | { state: 'pending'; email: string; role: UserRole; expiresAt: string }
  | { state: 'accepted' | 'expired' | 'unknown' };

/**
 * Invites `email` with `role`. With `mail.linkOrigin` (e.g. `https://orientry.example`) the
 * invitation e-mail is queued in the same transaction as the invitation.
 * @throws InputError (field `email`) when an account already uses the address.
 */
export async function create(
  input: z.output<typeof inviteSchema>,
  invitedById: number,
  now: Date = new Date(),
  mail: { linkOrigin?: string } = {}
): Promise<CreatedInvitation> {
  if (await User.findOne({ where: { email: input.email } })) {
    throw new InputError('invitation.account-exists', `An account already uses ${input.email}.`, {
      email: `An account already uses ${input.email}; add it to a project from the project settings.`
    });
  }
  const token = `inv_${crypto.randomBytes(32).toString('base64url')}`;
  const sequelize = Invitation.sequelize;
  if (!sequelize) throw new Error('The Invitation model is not bound to a database; open the database first.');
  const invitation = await sequelize.transaction(async (transaction) => {
    const created = await Invitation.create(
      {
        email: input.email,
        role: input.role,
        tokenHash: hashToken(token),
        invitedById,
        expiresAt: new Date(now.getTime() + INVITATION_LIFETIME_MS)
      },
      { transaction }
    );
    if (mail.linkOrigin) {
      const inviter = await User.findByPk(invitedById, { attributes: ['name'], transaction });
      await queueInvitationMail(
        {
          invitationId: created.id,
          email: created.email,
          role: created.role,
          invitedBy: inviter?.name ?? null,
          link: `${mail.linkOrigin}/invite/${token}`,
          expiresAt: created.expiresAt
        },
        { transaction }
      );
    }
    return created;
  });
  return {
    id: invitation.id,
    email: invitation.email,
    role: invitation.role,
    expiresAt: invitation.expiresAt.toISOString(),
    token
  };
}

/** Recent invitations, newest first (at most `limit`). */
export async function list(now: Date = new Date(), limit = 50): Promise<InvitationView[]> {
  const invitations = await Invitation.findAll({
    include: [{ model: User, as: 'invitedBy', attributes: ['name'] }],
    order: [['id', 'DESC']],
    limit
  });
  return invitations.map((invitation) => ({
    id: invitation.id,
    email: invitation.email,
    role: invitation.role,
    invitedBy: (invitation as Invitation & { invitedBy?: User | null }).invitedBy?.name ?? null,
    createdAt: invitation.createdAt.toISOString(),
    expiresAt: invitation.expiresAt.toISOString(),
    acceptedAt: invitation.acceptedAt?.toISOString() ?? null,
    state: stateOf(invitation, now)
  }));
}

/** Ends a pending invitation now, so its link stops working. Unknown or used ones are left alone. */
export async function withdraw(invitationId: number, now: Date = new Date()): Promise<void> {
  const invitation = await Invitation.findByPk(invitationId);
  if (invitation && stateOf(invitation, now) === 'pending') await invitation.update({ expiresAt: now });
}

/** What the link `token` leads to, without revealing anything for an unknown one. */
export async function lookUp(token: string, now: Date = new Date()): Promise<InvitationLookup> {
  const invitation = await findByToken(token);
  if (!invitation) return { state: 'unknown' };
  const state = stateOf(invitation, now);
  if (state !== 'pending') return { state };
  return {
    state,
    email: invitation.email,
    role: invitation.role,
    expiresAt: invitation.expiresAt.toISOString()
  };
}

/**
 * Creates the account of a pending invitation and marks it used, in one transaction.
 * @throws InputError (`invitation.unusable`) when the link is unknown, used or expired, or the
 *   address got an account meanwhile.
 */
export async function accept(
  token: string,
  input: z.output<typeof acceptSchema>,
  now: Date = new Date()
): Promise<User> {
  const passwordHash = await hashPassword(input.password);
  const sequelize = Invitation.sequelize;
  if (!sequelize) throw new Error('The Invitation model is not bound to a database; open the database first.');
  return sequelize.transaction(async (transaction) => {
    const invitation = await findByToken(token, transaction);
    if (!invitation || stateOf(invitation, now) !== 'pending') {
      throw new InputError('invitation.unusable', 'This invitation link was already used or has expired.');
    }
    if (await User.findOne({ where: { email: invitation.email }, transaction })) {
      throw new InputError(
        'invitation.unusable',
        `An account for ${invitation.email} exists already; sign in with it instead.`
      );
    }
    const user = await User.create(
      { email: invitation.email, name: input.name, role: invitation.role, passwordHash },
      { transaction }
    );
    const [changed] = await Invitation.update(
      { acceptedAt: now },
      { where: { id: invitation.id, acceptedAt: null }, transaction }
    );
    if (changed === 0) throw new InputError('invitation.unusable', 'This invitation link was used just now.');
    return user;
  });
}

function stateOf(invitation: Invitation, now: Date): InvitationState {
  if (invitation.acceptedAt) return 'accepted';
  return invitation.expiresAt.getTime() <= now.getTime() ? 'expired' : 'pending';
}

async function findByToken(token: string, transaction?: Transaction): Promise<Invitation | null> {
  if (!TOKEN_PATTERN.test(token)) return null;
  return Invitation.findOne({ where: { tokenHash: hashToken(token) }, transaction });
}

function hashToken(token: string): string {
  return crypto.createHash('sha256').update(token, 'utf8').digest('hex');
}
