/**
 * A throw-away database for a benchmark: a SQLite file in a new temporary folder, or a new
 * database on the PostgreSQL server named by BENCH_POSTGRES_URL (else TEST_POSTGRES_URL), whose
 * user needs CREATEDB. `drop()` deletes it again.
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { Sequelize } from 'sequelize';
import { parseDatabaseUrl, type DatabaseLocation } from '$lib/server/db/database-url';

/** A database that exists and is empty: where it is, its DATABASE_URL, and how to delete it. */
export interface BenchDatabase {
  /** `SQLite` or `PostgreSQL`, for table titles. */
  label: string;
  location: DatabaseLocation;
  url: string;
  drop(): Promise<void>;
}

/** The PostgreSQL server the benches may use, or undefined to bench SQLite only. */
export function benchPostgresUrl(): string | undefined {
  const url = (process.env.BENCH_POSTGRES_URL ?? process.env.TEST_POSTGRES_URL ?? '').trim();
  return url === '' ? undefined : url;
}

/** A new SQLite file in a new temporary folder. */
export function createSqliteBenchDatabase(): BenchDatabase {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'orientry-bench-db-'));
  const url = `sqlite:${path.join(dir, 'orientry.db')}`;
  return {
    label: 'SQLite',
    location: parseDatabaseUrl(url, process.cwd()),
    url,
    async drop() {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  };
}

/** A new database `orientry_bench_<random>` on the server at `adminUrl`. */
export async function createPostgresBenchDatabase(adminUrl: string): Promise<BenchDatabase> {
  const name = `orientry_bench_${crypto.randomBytes(5).toString('hex')}`;
  await onServer(adminUrl, `CREATE DATABASE ${name}`);
  const target = new URL(adminUrl);
  target.pathname = `/${name}`;
  const url = target.toString();
  return {
    label: 'PostgreSQL',
    location: parseDatabaseUrl(url, process.cwd()),
    url,
    // FORCE (PostgreSQL 13+) ends the sessions of a server that is still shutting down.
    drop: () => onServer(adminUrl, `DROP DATABASE IF EXISTS ${name} WITH (FORCE)`)
  };
}

async function onServer(adminUrl: string, sql: string): Promise<void> {
  const admin = new Sequelize(adminUrl, { dialect: 'postgres', logging: false, pool: { max: 1 } });
  try {
    await admin.query(sql);
  } finally {
    await admin.close();
  }
}
