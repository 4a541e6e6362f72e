import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import type { ServerConfig } from '../config';
import { ConfigError } from '../errors';

/** File name of the generated secret inside the data folder. */
export const AUTH_SECRET_FILE = 'auth-secret';

/**
 * The secret that signs session cookies: AUTH_SECRET when set, otherwise one generated on
 * first start and kept in `<DATA_DIR>/auth-secret` (mode 0600), so sessions survive restarts
 * without any setup. Several servers sharing one database must share AUTH_SECRET instead.
 * @throws ConfigError when the kept secret cannot be read or written.
 */
export function resolveAuthSecret(config: ServerConfig): string {
  if (config.authSecret) return config.authSecret;
  const file = path.join(config.dataDir, AUTH_SECRET_FILE);
  try {
    // `wx` fails when the file exists, so two processes starting together keep one secret.
    fs.writeFileSync(file, crypto.randomBytes(32).toString('hex') + '\n', { flag: 'wx', mode: 0o600 });
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'EEXIST') throw unusable(file, error);
  }
  let secret: string;
  try {
    secret = fs.readFileSync(file, 'utf8').trim();
  } catch (error) {
    throw unusable(file, error);
  }
  if (secret.length < 32) {
    throw new ConfigError(
      'config.auth-secret',
      `The session secret in "${file}" is too short (${secret.length} characters). Delete the file to let Orientry make a new one, or set AUTH_SECRET.`
    );
  }
  return secret;
}

function unusable(file: string, cause: unknown): ConfigError {
  const code = (cause as NodeJS.ErrnoException).code ?? 'unknown error';
  return new ConfigError(
    'config.auth-secret',
    `Orientry cannot keep its session secret in "${file}" (${code}). Set AUTH_SECRET or make DATA_DIR writable.`,
    { cause }
  );
}
