/**
 * The secret half of a project API token: how it is made, shown and checked. Only a SHA-256
 * hash and a short prefix are ever stored, so a leaked database does not leak usable tokens.
 */
import crypto from 'node:crypto';

/** Every token secret starts with this, so secret scanners and people can tell what it is. */
export const TOKEN_SECRET_PREFIX = 'ort_';

/** How many characters of the secret are kept in clear to tell tokens apart in lists (`ort_` + 8). */
const SHOWN_PREFIX_LENGTH = TOKEN_SECRET_PREFIX.length + 8;

/** A secret of 32 random bytes is 43 base64url characters after the prefix. */
const SECRET_PATTERN = /^ort_[A-Za-z0-9_-]{43}$/;

/** A freshly made token secret: the clear text is shown once and then forgotten. */
export interface NewTokenSecret {
  secret: string;
  /** SHA-256 of the secret, lowercase hex: what is stored. */
  hash: string;
  /** The first characters of the secret, e.g. `ort_Zk3vQ9aB`, for lists. */
  prefix: string;
}

/** Makes a new secret `ort_` + 32 random bytes in base64url, with its hash and prefix. */
export function generateTokenSecret(): NewTokenSecret {
  const secret = TOKEN_SECRET_PREFIX + crypto.randomBytes(32).toString('base64url');
  return { secret, hash: hashTokenSecret(secret), prefix: secret.slice(0, SHOWN_PREFIX_LENGTH) };
}

/** SHA-256 of a secret as lowercase hex. */
export function hashTokenSecret(secret: string): string {
  return crypto.createHash('sha256').update(secret, 'utf8').digest('hex');
}

/** The list prefix of a secret (its first characters). */
export function prefixOfTokenSecret(secret: string): string {
  return secret.slice(0, SHOWN_PREFIX_LENGTH);
}

/** True when the text has the shape of a token secret; anything else is refused before a database look-up. */
export function isTokenSecretShape(text: string): boolean {
  return SECRET_PATTERN.test(text);
}

/**
 * Compares a presented secret with a stored hash in constant time (over the hashes, so the
 * lengths always match), so response timing reveals nothing about the stored value.
 */
export function secretMatchesHash(secret: string, storedHash: string): boolean {
  const presented = Buffer.from(hashTokenSecret(secret), 'hex');
  const stored = Buffer.from(storedHash, 'hex');
  if (stored.length !== presented.length) return false;
  return crypto.timingSafeEqual(presented, stored);
}
