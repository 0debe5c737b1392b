import request from 'supertest';
import type { Express } from 'express';
import { createApp } from '../../server/app';
import { createDb, migrateLatest, type Db } from '../../server/db/knex';
import { fixedClock, type Clock } from '../../server/lib/clock';
import { hashPassword } from '../../server/lib/passwords';
import { createMailInbox, type MailInbox } from '../../server/mail/fake-smtp';
import type { UploadJobs } from '../../server/modules/uploads/upload-jobs';
import type { ThrottleRules } from '../../server/modules/auth/login-throttle';
import { newLinkToken } from '../../server/lib/link-tokens';
import { openTestDb } from './test-database';

export const PASSWORD = 'correct-horse-battery';
// One hash for every test account: hashing is deliberately slow.
const passwordHash = hashPassword(PASSWORD);

export type Who = 'admin' | 'lead' | 'observer' | 'reader' | 'pi' | 'outsider';
export const emails: Record<Who, string> = {
  admin: 'admin@test.invalid',
  lead: 'lead@test.invalid',
  observer: 'observer@test.invalid',
  reader: 'reader@test.invalid',
  pi: 'pi@test.invalid',
  outsider: 'outsider@test.invalid',
};

export interface World {
  db: Db;
  app: Express;
  projectId: number;
  otherProjectId: number;
  targetId: number;
  userIds: Record<Who, number>;
  /** The mail fake's inbox the site admin's mail page reads (tests add to it directly). */
  mailInbox: MailInbox;
  /** The security log's lines (server/lib/security-log.ts), each parsed from its JSON, in order; `logText` as written. */
  logLines: Array<Record<string, unknown>>;
  logText: string[];
  /** The app's clock (a fixed one unless the test gave its own): what one-time codes are made for. */
  clock: Clock;
}

/**
 * A fresh database (in memory on SQLite, its own database on PostgreSQL:
 * see test-database.ts) with one project (lead, observer, reader, pi as
 * members), a second project whose only member is the outsider, a site admin
 * who belongs to neither, and one target.
 */
export async function makeWorld(
  options: { loginThrottle?: Partial<ThrottleRules>; trustProxy?: string | number | boolean; clientDir?: string; clock?: Clock; databaseFile?: string; databaseUrl?: string; uploadJobs?: UploadJobs; adminSecondFactor?: 'required' | 'optional' } = {},
): Promise<World> {
  // On SQLite a file when a test needs a second connection to the same database; in memory otherwise.
  const db = options.databaseUrl ? createDb(options.databaseUrl) : await openTestDb(`file:${options.databaseFile ?? ':memory:'}`);
  await migrateLatest(db);
  const at = '2026-11-30T22:00:00.000Z';
  const hash = await passwordHash;
  const userIds = {} as Record<Who, number>;
  for (const who of Object.keys(emails) as Who[]) {
    const [row] = await db('users')
      .insert({ email: emails[who], name: `Test ${who}`, password_hash: hash, is_site_admin: who === 'admin', created_at: at, updated_at: at })
      .returning('id');
    userIds[who] = row.id;
  }
  const site = { site_name: 'Test Site', site_latitude_deg: 10, site_longitude_deg: 20, site_elevation_m: 100, site_time_zone: 'Etc/UTC' };
  const [p1] = await db('projects').insert({ code: 'TEST', name: 'Test programme', description: '', ...site, created_at: at, updated_at: at }).returning('id');
  const [p2] = await db('projects').insert({ code: 'OTHER', name: 'Other programme', description: '', ...site, created_at: at, updated_at: at }).returning('id');
  for (const role of ['lead', 'observer', 'reader', 'pi'] as const) {
    await db('project_members').insert({ project_id: p1.id, user_id: userIds[role], role, added_at: at });
  }
  await db('project_members').insert({ project_id: p2.id, user_id: userIds.outsider, role: 'lead', added_at: at });
  const [t] = await db('targets')
    .insert({ project_id: p1.id, designation: 'T 1', designation_key: 't1', ra_deg: 10, dec_deg: -5, notes: '', tags: '[]', created_at: at, updated_at: at })
    .returning('id');
  const mailInbox = createMailInbox();
  const logText: string[] = [];
  const logLines: Array<Record<string, unknown>> = [];
  const logDestination = { write: (line: string) => void (logText.push(line), logLines.push(JSON.parse(line))) };
  const clock = options.clock ?? fixedClock('2026-12-01T03:00:00.000Z');
  const app = createApp({
    db,
    clock,
    sessionSecret: 'test-secret',
    sessionCleanupIntervalMs: 0,
    loginThrottle: options.loginThrottle,
    trustProxy: options.trustProxy,
    clientDir: options.clientDir,
    mailInbox,
    uploadJobs: options.uploadJobs,
    logDestination,
    // The world's site admin has no second factor; tests/api/second-factor.test.ts asks for `required`, the app's default.
    adminSecondFactor: options.adminSecondFactor ?? 'optional',
  });
  return { db, app, projectId: p1.id, otherProjectId: p2.id, targetId: t.id, userIds, mailInbox, logLines, logText, clock };
}

export interface Session {
  agent: ReturnType<typeof request.agent>;
  csrf: string;
}

/** Signs in and returns a cookie-carrying agent plus the CSRF token to send with writes. */
export async function signIn(app: Express, who: Who): Promise<Session> {
  const agent = request.agent(app);
  const res = await agent.post('/api/auth/login').send({ email: emails[who], password: PASSWORD });
  if (res.status !== 200) throw new Error(`sign-in as ${who} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return { agent, csrf: res.body.csrfToken };
}

/** One proposed value (a 10 pc parallax distance) of the world's target, written straight into the table, for the review route to decide on. */
export async function proposeValue(w: World, proposedBy: Who | null = null): Promise<number> {
  const [row] = await w.db('derived_values')
    .insert({
      project_id: w.projectId,
      target_id: w.targetId,
      quantity: 'distance_parallax',
      value: 3.0857e17,
      uncertainty: 3e15,
      unit: 'm',
      method: 'inverse_parallax',
      method_label: 'd = 1/p',
      inputs_json: '[]',
      constants_json: '[]',
      warnings_json: '[]',
      revision: 1,
      status: 'proposed',
      proposed_by_user_id: proposedBy ? w.userIds[proposedBy] : null,
      created_at: '2026-11-30T23:00:00.000Z',
    })
    .returning('id');
  return row.id;
}

let linkCount = 0;

/**
 * Writes an open invitation (to a fresh address, as reader of the world's
 * project, from the lead) or an open reset link (for the outsider) straight
 * into the database, and returns the link's token.
 */
export async function openLink(w: World, kind: 'invitation' | 'reset', options: { email?: string; expiresAt?: string } = {}): Promise<string> {
  const { token, hash } = newLinkToken();
  const createdAt = '2026-12-01T02:30:00.000Z';
  if (kind === 'invitation') {
    linkCount += 1;
    await w.db('invitations').insert({
      project_id: w.projectId,
      email: options.email ?? `invited-${linkCount}@test.invalid`,
      role: 'reader',
      token_hash: hash,
      invited_by: w.userIds.lead,
      expires_at: options.expiresAt ?? '2026-12-08T02:30:00.000Z',
      created_at: createdAt,
    });
  } else {
    const [user] = await w.db('users').where('email', options.email ?? emails.outsider).select('id');
    await w.db('password_resets').insert({ user_id: user.id, token_hash: hash, expires_at: options.expiresAt ?? '2026-12-01T03:30:00.000Z', created_at: createdAt });
  }
  return token;
}
