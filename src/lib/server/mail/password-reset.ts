/**
 * Password reset by e-mail: someone who forgot the password asks for a link at `/reset`, gets
 * a signed link `/reset/<token>` valid for an hour, and sets a new password there. The link is
 * signed with the account's current password hash as its binding, so it works once: setting a
 * password changes the hash and voids every earlier link. The request always answers the same,
 * whether or not an account uses the address, so the form cannot be used to probe for accounts.
 * Import as a namespace: `passwordReset.request(...)`.
 */
import { z } from 'zod';
import { hashPassword } from '../auth/password';
import { User } from '../db/models';
import { PASSWORD_MIN_LENGTH } from '../invitations/invitations';
import * as outbox from './outbox';
import { renderPasswordResetMail } from './password-reset-mail';
import { checkUserToken, signUserToken, userIdOfToken } from './signed-user-token';

/** How long a link works: long enough to switch to the mail client, short enough to go stale soon. */
export const RESET_LINK_LIFETIME_MS = 60 * 60 * 1000;

/** At most one reset e-mail per account in this window, however often the form is sent. */
export const RESET_MAIL_WINDOW_MS = 2 * 60 * 1000;

/** The request form. */
export const requestResetSchema = z.object({
  email: z
    .string('Enter the e-mail address of your account.')
    .trim()
    .toLowerCase()
    .pipe(z.email('Enter an e-mail address such as name@studio.example.'))
});

/** The new-password form (typed twice). */
export const newPasswordSchema = z
  .object({
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

/** What a visitor of a reset link is told. */
export type ResetLookup = { status: 'valid'; email: string } | { status: 'expired' | 'invalid' };

/**
 * Queues a reset e-mail when an active account uses `email`; does nothing otherwise (the caller
 * answers the same either way).
 */
export async function request(email: string, origin: string, now: Date = new Date()): Promise<void> {
  const user = await User.findOne({ where: { email, disabledAt: null } });
  if (!user) return;
  const expiresAt = new Date(now.getTime() + RESET_LINK_LIFETIME_MS);
  const link = `${origin}/reset/${signUserToken('password-reset', user.id, expiresAt, user.passwordHash)}`;
  const mail = renderPasswordResetMail({ name: user.name, link, expiresAt, signInUrl: `${origin}/signin` });
  await outbox.enqueue({
    kind: 'password-reset',
    toAddress: user.email,
    subject: mail.subject,
    textBody: mail.text,
    htmlBody: mail.html,
    dedupeKey: `password-reset:${user.id}:${Math.floor(now.getTime() / RESET_MAIL_WINDOW_MS)}`
  });
}

/** Whether `token` is a usable link, and for which address. */
export async function lookUp(token: string, now: Date = new Date()): Promise<ResetLookup> {
  const { status, user } = await check(token, now);
  return status === 'valid' && user
    ? { status, email: user.email }
    : { status: status === 'valid' ? 'invalid' : status };
}

/** Sets the password of the link's account, which voids the link. */
export async function complete(token: string, password: string, now: Date = new Date()): Promise<ResetLookup> {
  const { status, user } = await check(token, now);
  if (status !== 'valid' || !user) return { status: status === 'valid' ? 'invalid' : status };
  const passwordHash = await hashPassword(password);
  // Only while the hash is still the one the link was signed with: two tabs cannot both use it.
  const [changed] = await User.update({ passwordHash }, { where: { id: user.id, passwordHash: user.passwordHash } });
  return changed === 1 ? { status: 'valid', email: user.email } : { status: 'invalid' };
}

async function check(token: string, now: Date): Promise<{ status: 'valid' | 'expired' | 'invalid'; user?: User }> {
  const userId = userIdOfToken(token);
  if (userId === null) return { status: 'invalid' };
  const user = await User.findOne({ where: { id: userId, disabledAt: null } });
  if (!user) return { status: 'invalid' };
  const result = checkUserToken('password-reset', token, now, user.passwordHash);
  return { status: result.status, user };
}
