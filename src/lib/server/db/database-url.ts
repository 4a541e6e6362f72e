import path from 'node:path';
import { ConfigError } from '../errors';

/** Where the database lives, as Sequelize needs it. */
export interface DatabaseLocation {
  dialect: 'sqlite';
  /** Absolute file path, or `:memory:` for a private in-memory database. */
  storage: string;
}

const EXAMPLE = 'Use sqlite:<path> (for example sqlite:data/orientry.db) or sqlite::memory:';

/**
 * Parses DATABASE_URL into a database location, resolving relative paths against `cwd`.
 * Accepted: `sqlite:path`, `sqlite://path` (both relative), `sqlite:/abs/path`, `sqlite:///abs/path`,
 * `sqlite::memory:`. PostgreSQL URLs are recognised but not supported yet.
 *
 * @example parseDatabaseUrl('sqlite:data/x.db', '/srv') → { dialect: 'sqlite', storage: '/srv/data/x.db' }
 * @throws ConfigError with a one-line message naming the value and what to use instead.
 */
export function parseDatabaseUrl(url: string, cwd: string): DatabaseLocation {
  const value = url.trim();
  if (/^postgres(ql)?:/i.test(value)) {
    throw new ConfigError(
      'config.database-url.unsupported',
      `DATABASE_URL "${redact(value)}" points at PostgreSQL, which Orientry does not support yet. ${EXAMPLE}.`
    );
  }
  const match = /^sqlite:(.*)$/i.exec(value);
  if (!match) {
    throw new ConfigError(
      'config.database-url.invalid',
      `DATABASE_URL "${redact(value)}" is not a database URL Orientry understands. ${EXAMPLE}.`
    );
  }
  let rest = match[1];
  if (rest === ':memory:' || rest === '//:memory:') return { dialect: 'sqlite', storage: ':memory:' };
  // `sqlite://a/b` is relative like `sqlite:a/b`; `sqlite:///a/b` keeps its leading slash.
  if (rest.startsWith('//')) rest = rest.slice(2);
  if (rest.includes('?')) rest = rest.slice(0, rest.indexOf('?'));
  if (rest.trim() === '') {
    throw new ConfigError('config.database-url.invalid', `DATABASE_URL "${value}" has no file path. ${EXAMPLE}.`);
  }
  return { dialect: 'sqlite', storage: path.resolve(cwd, decodeURIComponent(rest)) };
}

/** Hides a password in a URL before it goes into a message. */
function redact(url: string): string {
  return url.replace(/^([a-z][a-z0-9+.-]*:\/\/[^:/@]*):[^@/]*@/i, '$1:***@');
}
