/**
 * One-click unsubscribe for build e-mails (RFC 8058): every build e-mail carries a signed link
 * `/unsubscribe/<token>` for its recipient, in the body and in `List-Unsubscribe`. Opening it
 * shows a confirmation page; a POST (the page's button, or the mail client's one-click request)
 * sets the person's mail preference to `none`. Import as a namespace: `unsubscribeLink.urlFor(...)`.
 */
import { User } from '../db/models';
import { checkUserToken, signUserToken } from './signed-user-token';

/** How long a link works: old e-mails stay usable for a season, then the profile page is the way. */
export const UNSUBSCRIBE_LINK_LIFETIME_MS = 90 * 24 * 60 * 60 * 1000;

/** What a visitor of the link is told. */
export type UnsubscribeLookup =
  { status: 'valid'; email: string; isUnsubscribed: boolean } | { status: 'expired' | 'invalid' };

/** The absolute link for `userId`, valid from `now` for {@link UNSUBSCRIBE_LINK_LIFETIME_MS}. */
export function urlFor(origin: string, userId: number, now: Date = new Date()): string {
  const token = signUserToken('unsubscribe', userId, new Date(now.getTime() + UNSUBSCRIBE_LINK_LIFETIME_MS));
  return `${origin}/unsubscribe/${token}`;
}

/** Whose link `token` is, without changing anything (the confirmation page). */
export async function lookUp(token: string, now: Date = new Date()): Promise<UnsubscribeLookup> {
  const check = checkUserToken('unsubscribe', token, now);
  if (check.status !== 'valid') return { status: check.status };
  const user = await User.findByPk(check.userId);
  if (!user) return { status: 'invalid' };
  return { status: 'valid', email: user.email, isUnsubscribed: user.mailPreference === 'none' };
}

/** Stops build e-mails for the link's owner (mail preference `none`); repeating it is harmless. */
export async function confirm(token: string, now: Date = new Date()): Promise<UnsubscribeLookup> {
  const check = checkUserToken('unsubscribe', token, now);
  if (check.status !== 'valid') return { status: check.status };
  const user = await User.findByPk(check.userId);
  if (!user) return { status: 'invalid' };
  if (user.mailPreference !== 'none') await user.update({ mailPreference: 'none' });
  return { status: 'valid', email: user.email, isUnsubscribed: true };
}
