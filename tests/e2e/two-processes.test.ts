import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, type Db } from '../../server/db/knex';
import { migrationSource } from '../../migrations';
import { startFakeSmtp, type FakeSmtp } from '../../server/mail/fake-smtp';
import { enqueueMail } from '../../server/mail/outbox';
import { demoAccounts, demoProject } from '../../seeds/01-demo-scenario';
import { newTestDatabase, onPostgres, type TestDatabase } from '../support/test-database';
import { startApp, type RunningApp } from './support/harness';

/**
 * Two production servers (build/server.js) on one PostgreSQL database, as
 * behind a load balancer, with one SMTP fake that both send to. What the
 * checks expect is stated outside the code: issue 12 item 5 (a session made
 * on one process works on another; each background job is done once however
 * many processes run) and the README (a password change ends the other
 * sessions; one weekly summary per person and ISO week; a preview expires
 * after PREVIEW_MAX_AGE_HOURS, 48 by default; "Several app processes"), with
 * the demo scenario of seeds/ as the data.
 */
if (!onPostgres) console.warn('\n*** SKIPPING THE TWO-PROCESS TEST: it needs PostgreSQL (TEST_DATABASE=postgres://… of a role that may create databases). ***\n');

interface Session {
  cookie: string;
  csrfToken: string;
}

interface Answer {
  status: number;
  body: any; // eslint-disable-line @typescript-eslint/no-explicit-any -- each check reads the fields it names
  session?: Session;
}

/** One request to a process's API, as a browser with `session` would send it; a new session cookie the answer sets comes back with it. */
async function call(app: RunningApp, session: Session | null, method: string, path: string, body?: unknown): Promise<Answer> {
  const form = body instanceof FormData;
  const res = await fetch(`${app.baseUrl}/api${path}`, {
    method,
    headers: {
      ...(session ? { Cookie: session.cookie, 'X-CSRF-Token': session.csrfToken } : {}),
      ...(body === undefined || form ? {} : { 'Content-Type': 'application/json' }),
    },
    body: body === undefined ? undefined : form ? body : JSON.stringify(body),
  });
  const text = await res.text();
  const json = text ? JSON.parse(text) : null;
  const cookie = res.headers.get('set-cookie')?.split(';')[0];
  return { status: res.status, body: json, session: cookie && json?.csrfToken ? { cookie, csrfToken: json.csrfToken } : undefined };
}

async function signIn(app: RunningApp, email: string, password: string = demoAccounts.find((a) => a.email === email)!.password): Promise<Session> {
  const answer = await call(app, null, 'POST', '/auth/login', { email, password });
  expect(answer.status, `signing ${email} in on ${app.baseUrl}`).toBe(200);
  return answer.session!;
}

/** Asks `check` until it answers something other than undefined; fails naming `what` if that never comes. */
async function until<T>(what: string, check: () => Promise<T | undefined>, limitMs = 30_000): Promise<T> {
  const deadline = Date.now() + limitMs;
  for (;;) {
    const found = await check();
    if (found !== undefined) return found;
    if (Date.now() > deadline) throw new Error(`waited in vain for ${what}`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

/** The ISO weekday (1 = Monday) and 24-hour time of an instant in a time zone, as a summary schedule names them. */
function scheduleAt(at: Date, timeZone: string): { weekday: number; time: string } {
  const parts = new Intl.DateTimeFormat('en-GB', { timeZone, weekday: 'short', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).formatToParts(at);
  const get = (type: string) => parts.find((p) => p.type === type)!.value;
  return { weekday: ['Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat', 'Sun'].indexOf(get('weekday')) + 1, time: `${get('hour')}:${get('minute')}` };
}

describe.skipIf(!onPostgres)('two app processes on one PostgreSQL database', () => {
  let database: TestDatabase;
  let db: Db;
  let smtp: FakeSmtp;
  let apps: RunningApp[] = [];
  let projectId: number;

  /**
   * Both processes at once, on the one database, sending through the one
   * fake, each with its own data directory but the secrets the README says
   * every process must share: a password hashed by one (with its pepper) is
   * checked by the other, a session signed by one is read by the other.
   */
  const sharedSecrets = { PASSWORD_PEPPER: 'two-processes-pepper-'.padEnd(64, 'p'), SESSION_SECRET: 'two-processes-session-secret', SECOND_FACTOR_KEY: 'two-processes-second-factor-key'.padEnd(64, 'k') };
  const startBoth = async () => {
    const started = await Promise.allSettled([0, 1].map(() => startApp({ databaseUrl: database.url, env: { SMTP_URL: smtp.url, ...sharedSecrets } })));
    apps = started.flatMap((s) => (s.status === 'fulfilled' ? [s.value] : []));
    const failed = started.find((s) => s.status === 'rejected');
    if (failed) throw failed.reason;
  };
  const stopBoth = async () => {
    await Promise.all(apps.map((app) => app.stop()));
    apps = [];
  };

  beforeAll(async () => {
    database = await newTestDatabase(undefined, { migrated: false });
    smtp = await startFakeSmtp();
    await startBoth();
    db = createDb(database.url);
    projectId = (await db('projects').where({ code: demoProject.code }).first('id')).id;
    // The weekly summary falls due two minutes ago, so both schedulers find it at their next minute's look, while the checks before its own run.
    const pi = await signIn(apps[0], 'pi@demo.invalid');
    const { timeZone } = (await call(apps[0], pi, 'GET', `/projects/${projectId}/summary`)).body.settings;
    const due = scheduleAt(new Date(Date.now() - 120_000), timeZone);
    expect((await call(apps[0], pi, 'PATCH', `/projects/${projectId}/summary`, { enabled: true, ...due })).status).toBe(200);
  });
  afterAll(async () => {
    await stopBoth();
    await db?.destroy();
    await smtp?.close();
    await database?.drop();
  });

  it('both come up when started at once on an empty database, and the demo is seeded once', async () => {
    const [a, b] = apps;
    expect(a.pid).not.toBe(b.pid);
    // Source: seeds/01-demo-scenario.ts (its accounts and project) and 02-demo-season.ts (its one season file).
    const emails = (await db('users').orderBy('email').select('email')).map((u: { email: string }) => u.email);
    expect(emails).toEqual(demoAccounts.map((d) => d.email).sort());
    expect(await db('projects').where({ code: demoProject.code }).pluck('id')).toHaveLength(1);
    expect(await db('uploads').where({ filename: 'glasswing-season-2026.csv' }).pluck('id')).toHaveLength(1);
    // Source: migrations/index.ts, each migration run once.
    const migrated: string[] = await db('knex_migrations').orderBy('name').pluck('name');
    expect(migrated, 'the migrations build/server.js ran (npm run build after migrations/ changes)').toEqual([...(await migrationSource.getMigrations([]))].sort());
    for (const app of apps) expect((await call(app, await signIn(app, 'reader@demo.invalid'), 'GET', '/auth/me')).body.user.email).toBe('reader@demo.invalid');
  });

  it('a session signed in on one process is accepted on the other, and signing out on the other ends it on both', async () => {
    const [a, b] = apps;
    const session = await signIn(a, 'lead@demo.invalid');
    const onB = await call(b, session, 'GET', '/auth/me');
    expect(onB.status).toBe(200);
    expect(onB.body.user.email).toBe('lead@demo.invalid');
    // A write on B with the CSRF token A gave (the token lives in the shared session), read back on A.
    const reviewNotice = async (app: RunningApp): Promise<boolean> =>
      (await call(app, session, 'GET', '/mail-preferences')).body.preferences.find((p: { projectId: number }) => p.projectId === projectId).reviewNotice;
    const before = await reviewNotice(a);
    expect((await call(b, session, 'PATCH', `/projects/${projectId}/mail-preferences`, { reviewNotice: !before })).status).toBe(200);
    expect(await reviewNotice(a)).toBe(!before);

    expect((await call(b, session, 'POST', '/auth/logout')).status).toBe(204);
    expect((await call(a, session, 'GET', '/auth/me')).status).toBe(401);
    expect((await call(b, session, 'GET', '/auth/me')).status).toBe(401);
  });

  it('a password changed on one process ends the account’s sessions on the other', async () => {
    const [a, b] = apps;
    const onA = await signIn(a, 'observer@demo.invalid');
    const onB = await signIn(b, 'observer@demo.invalid');
    const changed = await call(b, onB, 'POST', '/auth/password', { currentPassword: 'observer-demo-2026', password: 'lamplight over the ridge' });
    expect(changed.status).toBe(200);
    expect((await call(a, onA, 'GET', '/auth/me')).status).toBe(401);
    expect((await call(b, onB, 'GET', '/auth/me')).status).toBe(401);
    // The browser that changed it carries on, on either process; the new password signs in on the other.
    expect((await call(a, changed.session!, 'GET', '/auth/me')).status).toBe(200);
    await signIn(a, 'observer@demo.invalid', 'lamplight over the ridge');
    expect((await call(a, null, 'POST', '/auth/login', { email: 'observer@demo.invalid', password: 'observer-demo-2026' })).status).toBe(401);
  });

  it('each queued mail is delivered once although both processes run outbox workers', async () => {
    const count = 100;
    const subject = (i: number) => `Two processes, message ${i}`;
    await db.transaction(async (trx) => {
      for (let i = 1; i <= count; i++) {
        await enqueueMail(trx, { purpose: 'review_notice', idempotencyKey: `two-processes:${i}`, to: `member${i}@demo.invalid`, subject: subject(i), html: `<p>${i}</p>`, text: String(i) });
      }
    });
    const keys = (q: Db) => q('mail_outbox').where('idempotency_key', 'like', 'two-processes:%');
    await until('every queued message to be marked sent', async () => {
      const left = await keys(db).whereNot('status', 'sent').pluck('id');
      return left.length === 0 ? true : undefined;
    });
    const caught = smtp.inbox.messages().filter((m) => m.subject.startsWith('Two processes, message '));
    expect(caught.map((m) => m.subject).sort()).toEqual(Array.from({ length: count }, (_, i) => subject(i + 1)).sort());
    const rows: { attempts: number; claimed_by: string }[] = await keys(db).select('attempts', 'claimed_by');
    expect(rows.every((r) => r.attempts === 1)).toBe(true);
    // Both workers took part (claimed_by is host:pid:…), so the race was run, not avoided.
    expect(new Set(rows.map((r) => Number(r.claimed_by.split(':')[1])))).toEqual(new Set(apps.map((app) => app.pid)));
  });

  it('a weekly summary that falls due (set so before the first check) is sent once to each recipient', async () => {
    const [a] = apps;
    const pi = await signIn(a, 'pi@demo.invalid');
    const { settings } = (await call(a, pi, 'GET', `/projects/${projectId}/summary`)).body;
    const recipients: string[] = settings.recipients.map((r: { email: string }) => r.email);
    expect(recipients).toContain('pi@demo.invalid');

    const prefix = `weekly_summary:${projectId}:`;
    const sent = await until(
      'the weekly summary to be sent to every recipient',
      async () => {
        const rows: { to: string; subject: string; status: string }[] = await db('mail_outbox').where('idempotency_key', 'like', `${prefix}%`).select('to', 'subject', 'status');
        return rows.length >= recipients.length && rows.every((r) => r.status === 'sent') ? rows : undefined;
      },
      90_000,
    );
    expect(sent.map((r) => r.to).sort()).toEqual([...recipients].sort());
    for (const to of recipients) {
      expect(smtp.inbox.messages().filter((m) => m.to.includes(to) && m.subject.startsWith('Starledger weekly summary:')), to).toHaveLength(1);
    }
  }, 120_000);

  it('a preview left uncommitted too long is expired once, with one trail entry, though both processes expire previews as they start', async () => {
    const [a] = apps;
    const observer = await signIn(a, 'observer@demo.invalid', 'lamplight over the ridge');
    const form = new FormData();
    form.append('kind', 'measurements');
    form.append('file', new Blob(['target,quantity,value,uncertainty,unit\nGW 101,parallax,41.2,0.3,mas\n']), 'left-behind.csv');
    const created = await call(a, observer, 'POST', `/projects/${projectId}/uploads`, form);
    expect(created.status).toBe(201);
    const uploadId: number = created.body.upload.id;
    expect(created.body.upload.status).toBe('previewed');

    // Made three days ago: past the 48 hours a preview may wait (PREVIEW_MAX_AGE_HOURS, README).
    await db('uploads').where({ id: uploadId }).update({ created_at: new Date(Date.now() - 72 * 3_600_000).toISOString() });
    await stopBoth();
    await startBoth();
    await until('the preview to be expired', async () => ((await db('uploads').where({ id: uploadId }).first('status')).status === 'discarded' ? true : undefined));
    // Stopping waits for each process's round under way, so both have tried by now.
    await stopBoth();
    const trail = await db('trail_events').where({ entity_type: 'upload', entity_id: uploadId }).orderBy('id').select('action');
    expect(trail.map((t: { action: string }) => t.action)).toEqual(['upload.received', 'upload.expired']);
  }, 120_000);
});
