import crypto from 'node:crypto';
import knex from 'knex';
import { inject } from 'vitest';
import { createDb, migrateLatest, type Db } from '../../server/db/knex';

/**
 * Which engine the API and browser tests run on. Unset: SQLite (in memory,
 * or a file where a test needs one). TEST_DATABASE=postgres://…/postgres (a
 * URL of a role that may create databases, as `npm run test:pg` sets it):
 * PostgreSQL, with a fresh database for each world or app, so test files
 * can run side by side. Each is a copy of one database the migrations ran
 * on at the start of the run (CREATE DATABASE … TEMPLATE, a fraction of the
 * time of migrating each afresh; the copy's own migrateLatest then finds
 * nothing to do).
 */
const adminUrl = process.env.TEST_DATABASE?.trim() || undefined;
if (adminUrl && !/^postgres(ql)?:\/\//.test(adminUrl)) throw new Error(`TEST_DATABASE must be a postgres:// URL, not ${adminUrl}`);

export const onPostgres = adminUrl !== undefined;

export interface TestDatabase {
  /** The URL to hand createDb or a server's DATABASE_URL. */
  url: string;
  /** Drops the database (PostgreSQL) after every connection to it has closed. */
  drop(): Promise<void>;
}

/**
 * A new database: on PostgreSQL one made for the caller on the
 * TEST_DATABASE server, migrated (a copy of the run's template) or, with
 * `migrated: false`, without a table (for tests of start-up on an empty
 * database); on SQLite the given URL as it is (`file::memory:` unless the
 * test needs a file).
 */
export async function newTestDatabase(sqliteUrl = 'file::memory:', options: { migrated?: boolean } = {}): Promise<TestDatabase> {
  if (!adminUrl) return { url: sqliteUrl, drop: async () => undefined };
  const name = `sl_test_${crypto.randomBytes(6).toString('hex')}`;
  await admin((a) => a.raw(options.migrated === false ? `create database ${name}` : `create database ${name} template ${inject('migratedTemplate')}`));
  return {
    url: urlOf(name),
    // WITH (FORCE) ends a connection a test left open (PostgreSQL 13 and later).
    drop: () => admin((a) => a.raw(`drop database if exists ${name} with (force)`)),
  };
}

/**
 * A knex handle on a new empty database; its destroy() also drops the
 * database, so tests close it as they close an in-memory one.
 */
export async function openTestDb(sqliteUrl = 'file::memory:'): Promise<Db> {
  const database = await newTestDatabase(sqliteUrl);
  const db = createDb(database.url);
  if (!onPostgres) return db;
  // knex's destroy() is read-only on the handle and hands over to its client's.
  const client = db.client as { destroy(callback?: (err?: unknown) => void): Promise<void> };
  const destroy = client.destroy.bind(client);
  let dropped: Promise<void> | undefined;
  client.destroy = (callback) => {
    dropped ??= destroy().then(() => database.drop());
    return dropped.then(() => callback?.(), (err) => (callback ? callback(err) : Promise.reject(err)));
  };
  return db;
}

function urlOf(name: string): string {
  const url = new URL(adminUrl!);
  url.pathname = `/${name}`;
  return url.toString();
}

declare module 'vitest' {
  export interface ProvidedContext {
    /** The migrated database every test database on PostgreSQL is copied from. */
    migratedTemplate: string;
  }
}

/**
 * The api and e2e projects' globalSetup: on PostgreSQL, makes and migrates
 * the template for this run, and drops it when the run ends.
 */
export async function setup(project: { provide(key: 'migratedTemplate', value: string): void }): Promise<(() => Promise<void>) | undefined> {
  if (!adminUrl) return undefined;
  const name = `sl_template_${crypto.randomBytes(6).toString('hex')}`;
  await admin((a) => a.raw(`create database ${name}`));
  const db = createDb(urlOf(name));
  try {
    await migrateLatest(db);
  } finally {
    await db.destroy();
  }
  project.provide('migratedTemplate', name);
  return () => admin((a) => a.raw(`drop database if exists ${name} with (force)`));
}

async function admin(work: (a: knex.Knex) => Promise<unknown>): Promise<void> {
  const a = knex({ client: 'pg', connection: adminUrl, pool: { min: 0, max: 1 } });
  try {
    await work(a);
  } finally {
    await a.destroy();
  }
}
