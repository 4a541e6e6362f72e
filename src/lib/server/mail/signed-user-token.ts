/**
 * Signed links for one person: `<userId>.<expiresAtSeconds>.<signature>`, where the signature is
 * an HMAC-SHA256 under a key derived (HKDF) from the session secret for one purpose, so an
 * unsubscribe link can never serve as a password-reset link. Nothing is stored: the link carries
 * its own proof. A `binding` (such as the current password hash) is signed but not sent, so
 * changing it voids every earlier link; that makes reset links one-time.
 */
import crypto from 'node:crypto';
import { resolveAuthSecret } from '../auth/auth-secret';
import { getConfig, type ServerConfig } from '../config';

/** What a link may be used for; each purpose signs with its own key. */
export type UserTokenPurpose = 'unsubscribe' | 'password-reset';

/** The outcome of checking a link. */
export type UserTokenCheck =
  | { status: 'valid'; userId: number; expiresAt: Date }
  | { status: 'expired'; userId: number; expiresAt: Date }
  | { status: 'invalid' };

const TOKEN_PATTERN = /^([1-9][0-9]{0,15})\.([1-9][0-9]{0,11})\.([A-Za-z0-9_-]{43})$/;

/** Signs a link for `userId` that stops working at `expiresAt` (whole seconds). */
export function signUserToken(purpose: UserTokenPurpose, userId: number, expiresAt: Date, binding = ''): string {
  const expiresAtSeconds = Math.floor(expiresAt.getTime() / 1000);
  return `${userId}.${expiresAtSeconds}.${signatureOf(purpose, userId, expiresAtSeconds, binding)}`;
}

/** The user a well-formed link names, before its signature is checked (to look up its binding). */
export function userIdOfToken(token: string): number | null {
  const match = TOKEN_PATTERN.exec(token);
  return match ? Number(match[1]) : null;
}

/**
 * Checks a link: `invalid` when malformed or its signature does not match (tampered, another
 * purpose, another binding, another secret); `expired` when genuine but past its time.
 */
export function checkUserToken(purpose: UserTokenPurpose, token: string, now: Date, binding = ''): UserTokenCheck {
  const match = TOKEN_PATTERN.exec(token);
  if (!match) return { status: 'invalid' };
  const userId = Number(match[1]);
  const expiresAtSeconds = Number(match[2]);
  const expected = Buffer.from(signatureOf(purpose, userId, expiresAtSeconds, binding), 'utf8');
  const given = Buffer.from(match[3], 'utf8');
  if (!crypto.timingSafeEqual(expected, given)) return { status: 'invalid' };
  const expiresAt = new Date(expiresAtSeconds * 1000);
  return { status: now.getTime() < expiresAt.getTime() ? 'valid' : 'expired', userId, expiresAt };
}

function signatureOf(purpose: UserTokenPurpose, userId: number, expiresAtSeconds: number, binding: string): string {
  return crypto
    .createHmac('sha256', keyFor(purpose))
    .update(`${userId}.${expiresAtSeconds}\n${binding}`, 'utf8')
    .digest('base64url');
}

let cachedKeys: { config: ServerConfig; keys: Map<UserTokenPurpose, Buffer> } | undefined;

/** The purpose's key, derived once per configuration (tests reset the configuration to change secrets). */
function keyFor(purpose: UserTokenPurpose): Buffer {
  const config = getConfig();
  if (cachedKeys?.config !== config) cachedKeys = { config, keys: new Map() };
  let key = cachedKeys.keys.get(purpose);
  if (!key) {
    const secret = resolveAuthSecret(config);
    key = Buffer.from(crypto.hkdfSync('sha256', secret, 'orientry signed links', `orientry ${purpose} v1`, 32));
    cachedKeys.keys.set(purpose, key);
  }
  return key;
}
