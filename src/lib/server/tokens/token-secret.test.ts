import crypto from 'node:crypto';
import { describe, expect, it } from 'vitest';
import {
  generateTokenSecret,
  hashTokenSecret,
  isTokenSecretShape,
  prefixOfTokenSecret,
  secretMatchesHash
} from './token-secret';

describe('token secrets', () => {
  it('makes an ort_ secret of 32 random bytes in base64url with its hash and prefix', () => {
    const { secret, hash, prefix } = generateTokenSecret();
    expect(secret.startsWith('ort_')).toBe(true);
    // RFC 4648 §5: 32 bytes are 43 base64url characters without padding.
    expect(Buffer.from(secret.slice(4), 'base64url')).toHaveLength(32);
    expect(secret).toHaveLength(4 + 43);
    expect(hash).toBe(crypto.createHash('sha256').update(secret).digest('hex'));
    expect(prefix).toBe(secret.slice(0, 12));
    expect(prefixOfTokenSecret(secret)).toBe(prefix);
  });

  it('makes a different secret each time', () => {
    expect(generateTokenSecret().secret).not.toBe(generateTokenSecret().secret);
  });

  it('hashes with SHA-256 as lowercase hex', () => {
    // FIPS 180-4 test vector: SHA-256("abc").
    expect(hashTokenSecret('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });

  it('matches a secret only against its own hash', () => {
    const token = generateTokenSecret();
    expect(secretMatchesHash(token.secret, token.hash)).toBe(true);
    expect(secretMatchesHash(generateTokenSecret().secret, token.hash)).toBe(false);
    expect(secretMatchesHash(token.secret, 'abcd')).toBe(false);
  });

  it.each([
    { text: generateTokenSecret().secret, expected: true },
    { text: 'ort_short', expected: false },
    { text: 'xyz_' + 'a'.repeat(43), expected: false },
    { text: 'ort_' + 'a'.repeat(42) + '=', expected: false },
    { text: '', expected: false }
  ])('recognises the secret shape of $text as $expected', ({ text, expected }) => {
    expect(isTokenSecretShape(text)).toBe(expected);
  });
});
