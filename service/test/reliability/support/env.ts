import { existsSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import pg from 'pg';
import { applyTestEnv, privateClusterPassword } from '../../utils/test-app.js';

/** The service workspace (where dist/main.js is), found from the working directory Jest runs in. */
export function serviceDir(): string {
  let dir = resolve(process.cwd());
  for (;;) {
    if (existsSync(join(dir, 'jest.config.cjs')) && existsSync(join(dir, 'src', 'main.ts'))) return dir;
    if (existsSync(join(dir, 'service', 'src', 'main.ts'))) return join(dir, 'service');
    const up = dirname(dir);
    if (up === dir) throw new Error(`cannot find the service workspace from ${process.cwd()}`);
    dir = up;
  }
}

/** The repository root (ops/, package.json). */
export const repoRoot = () => dirname(serviceDir());

/** DATABASE_URL of this suite (ops/test.sh sets it; the test-app defaults otherwise). */
export function suiteDatabaseUrl(): string {
  applyTestEnv();
  return process.env.DATABASE_URL!;
}

/**
 * A database of its own for one test, on the same cluster as the suite's: the suite's database name
 * with a suffix (crankjournal_reliability → crankjournal_reliability_kill).
 */
export function siblingDatabaseUrl(suffix: string): string {
  const u = new URL(suiteDatabaseUrl());
  u.pathname = `/${u.pathname.slice(1)}_${suffix}`;
  return u.toString();
}

export const databaseName = (url: string) => new URL(url).pathname.slice(1);

/**
 * The cluster's superuser (creating and dropping databases): RELIABILITY_PG_ADMIN_URL, or user postgres
 * on the suite's host and port with the password ops/ generated for the private clusters (.data/pg-superuser-password).
 */
export function adminUrl(): string {
  if (process.env.RELIABILITY_PG_ADMIN_URL) return process.env.RELIABILITY_PG_ADMIN_URL;
  const u = new URL(suiteDatabaseUrl());
  u.username = 'postgres';
  u.password = privateClusterPassword('pg-superuser-password');
  u.pathname = '/postgres';
  return u.toString();
}

async function asAdmin<T>(fn: (c: pg.Client) => Promise<T>): Promise<T> {
  const c = new pg.Client({ connectionString: adminUrl() });
  await c.connect();
  try {
    return await fn(c);
  } finally {
    await c.end();
  }
}

const ident = (name: string) => {
  if (!/^[a-z_][a-z0-9_]{0,62}$/.test(name)) throw new Error(`not a plain database name: ${name}`);
  return `"${name}"`;
};

/** Drops (if there) and creates the database of `url`, owned by the url's user. */
export async function freshDatabase(url: string): Promise<void> {
  const owner = new URL(url).username;
  await asAdmin(async (c) => {
    await c.query(`DROP DATABASE IF EXISTS ${ident(databaseName(url))} WITH (FORCE)`);
    await c.query(`CREATE DATABASE ${ident(databaseName(url))} OWNER ${ident(owner)}`);
  });
}

export async function dropDatabase(url: string): Promise<void> {
  await asAdmin((c) => c.query(`DROP DATABASE IF EXISTS ${ident(databaseName(url))} WITH (FORCE)`));
}

export async function databaseExists(name: string): Promise<boolean> {
  return asAdmin(async (c) => (await c.query('SELECT 1 FROM pg_database WHERE datname = $1', [name])).rowCount === 1);
}

/** Runs `fn` with a plain connection to `url`. */
export async function withClient<T>(url: string, fn: (c: pg.Client) => Promise<T>): Promise<T> {
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  try {
    return await fn(c);
  } finally {
    await c.end();
  }
}
