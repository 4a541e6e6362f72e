import path from 'node:path';
import { ConfigError } from '../errors';

/** A SQLite database file (or a private in-memory database). */
export interface SqliteLocation {
  dialect: 'sqlite';
  /** Absolute file path, or `:memory:` for a private in-memory database. */
  storage: string;
}

/** A PostgreSQL database on a server, reached through a connection URL. */
export interface PostgresLocation {
  dialect: 'postgres';
  /** The connection URL as given, password included: only ever handed to the driver. */
  url: string;
  /** The same URL with its password hidden, for messages and logs. */
  storage: string;
  /** The database name from the URL path. */
  databaseName: string;
}

/** Where the database lives, as Sequelize needs it. `storage` is always safe to print. */
export type DatabaseLocation = SqliteLocation | PostgresLocation;

const EXAMPLE =
  'Use sqlite:<path> (for example sqlite:data/orientry.db), sqlite::memory: or ' +
  'postgres://<user>:<password>@<host>:<port>/<database>';

/**
 * Parses DATABASE_URL into a database location, resolving relative SQLite paths against `cwd`.
 * Accepted: `sqlite:path`, `sqlite://path` (both relative), `sqlite:/abs/path`, `sqlite:///abs/path`,
 * `sqlite::memory:`, and `postgres://` or `postgresql://` URLs with a host and a database name
 * (query options such as `?ssl=true` go to the driver unchanged).
 *
 * @example parseDatabaseUrl('sqlite:data/x.db', '/srv') → { dialect: 'sqlite', storage: '/srv/data/x.db' }
 * @example parseDatabaseUrl('postgres://app:pw@db:5432/orientry', '/srv')
 *   → { dialect: 'postgres', url: 'postgres://app:pw@db:5432/orientry', storage: 'postgres://app:***@db:5432/orientry', databaseName: 'orientry' }
 * @throws ConfigError with a one-line message naming the value (password hidden) and what to use instead.
 */
export function parseDatabaseUrl(url: string, cwd: string): DatabaseLocation {
  const value = url.trim();
  if (/^postgres(ql)?:/i.test(value)) return parsePostgresUrl(value);
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

function parsePostgresUrl(value: string): PostgresLocation {
  const shown = redact(value);
  let parsed: URL;
  try {
    parsed = new URL(value);
  } catch (error) {
    throw new ConfigError(
      'config.database-url.invalid',
      `DATABASE_URL "${shown}" is not a valid URL. ${EXAMPLE}; percent-encode special characters in the password.`,
      { cause: error }
    );
  }
  if (!/^\/\/[^/?#]/.test(value.slice(value.indexOf(':') + 1)) || parsed.hostname === '') {
    throw new ConfigError(
      'config.database-url.invalid',
      `DATABASE_URL "${shown}" names no PostgreSQL host. ${EXAMPLE}.`
    );
  }
  const databaseName = decodeURIComponent(parsed.pathname.replace(/^\//, ''));
  if (databaseName === '' || databaseName.includes('/')) {
    throw new ConfigError(
      'config.database-url.invalid',
      `DATABASE_URL "${shown}" names no database (the path after the host, e.g. /orientry). ${EXAMPLE}.`
    );
  }
  return { dialect: 'postgres', url: value, storage: shown, databaseName };
}

/** Hides a password in a URL before it goes into a message. */
export function redact(url: string): string {
  return url.replace(/^([a-z][a-z0-9+.-]*:\/\/[^:/@]*):[^@/]*@/i, '$1:***@');
}
