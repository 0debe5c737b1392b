import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import net from 'node:net';
import { execFile } from 'node:child_process';
import { afterEach, describe, expect, it } from 'vitest';
import { createDb, migrateLatest, type Db } from '../../server/db/knex';
import { seedDemoIfEmpty } from '../../server/db/demo';
import { systemClock, type Clock } from '../../server/lib/clock';
import { createSmtpMailer } from '../../server/mail/mailer';
import { startFakeSmtp, type FakeSmtp } from '../../server/mail/fake-smtp';
import { enqueueMail } from '../../server/mail/outbox';
import { createOutboxWorker } from '../../server/mail/outbox-worker';
import { createSummaryService } from '../../server/modules/summary/summary.service';
import { newTestDatabase } from '../support/test-database';

/**
 * Delivery through real SMTP: every test talks to the local mail fake on a
 * free loopback port and reads what it received.
 */
const cleanups: (() => Promise<unknown> | unknown)[] = [];
afterEach(async () => {
  for (const c of cleanups.splice(0).reverse()) await c();
});

/** A migrated empty database (SQLite at `sqliteUrl`, or its own PostgreSQL database under TEST_DATABASE) and its URL. */
async function freshDatabase(sqliteUrl = 'file::memory:'): Promise<{ db: Db; url: string }> {
  const database = await newTestDatabase(sqliteUrl);
  cleanups.push(() => database.drop());
  const db = createDb(database.url);
  cleanups.push(() => db.destroy());
  await migrateLatest(db);
  return { db, url: database.url };
}

async function freshDb(): Promise<Db> {
  return (await freshDatabase()).db;
}

async function fake(port?: number): Promise<FakeSmtp> {
  const f = await startFakeSmtp({ port });
  cleanups.push(() => f.close());
  return f;
}

/** A clock the test moves by hand. */
function handClock(iso: string): Clock & { advance(ms: number): void } {
  let now = new Date(iso).getTime();
  return { now: () => new Date(now), advance: (ms) => (now += ms) };
}

const quiet = () => undefined;

describe('the demo project’s weekly summary, over SMTP', () => {
  it('reaches the PI with the week’s uploads, decisions, waiting values and warnings, each linked to its target sheet', async () => {
    const db = await freshDb();
    await seedDemoIfEmpty(db);
    const smtp = await fake();
    const project = await db('projects').where({ code: 'GLASSWING' }).first('id');
    const lead = await db('users').where({ email: 'lead@demo.invalid' }).first('id');
    const summary = createSummaryService(db, systemClock, { publicUrl: 'http://starledger.test' });
    const sent = await summary.sendNow(project.id, lead.id);
    expect(sent).toMatchObject({ queued: 1, alreadyQueued: 0 });

    const worker = createOutboxWorker({ db, mailer: createSmtpMailer(smtp.url, 'Starledger <starledger@localhost>'), log: quiet });
    expect(await worker.runOnce()).toEqual({ sent: 1, retried: 0, failed: 0 });
    const inbox = smtp.inbox.messages();
    expect(inbox).toHaveLength(1);
    const [mail] = inbox;
    expect(mail.to).toEqual(['pi@demo.invalid']);
    expect(mail.subject).toContain('Glasswing Nearby Dwarfs Programme');
    expect(mail.subject).toMatch(/\d{4}-W\d{2}$/);

    // The expected figures come from the database, counted independently of the summary's own queries.
    const approved = await db('trail_events').where({ project_id: project.id, action: 'value.approved' }).count<{ n: number }[]>({ n: '*' });
    const approvedTargets = await db('trail_events').where({ project_id: project.id, action: 'value.approved' }).countDistinct<{ n: number }[]>({ n: 'target_id' });
    const waiting = await db('derived_values').where({ project_id: project.id, status: 'proposed' }).count<{ n: number }[]>({ n: '*' });
    const waitingTargets = await db('derived_values').where({ project_id: project.id, status: 'proposed' }).countDistinct<{ n: number }[]>({ n: 'target_id' });
    const uploads = await db('uploads').where({ project_id: project.id, status: 'committed' }).select('filename', 'row_count');
    const text = mail.text;
    expect(text).toContain(`${uploads.length} files committed, ${uploads.reduce((n, u) => n + u.row_count, 0)} rows.`);
    for (const u of uploads) expect(text).toContain(u.filename);
    expect(text).toContain(`VALUES APPROVED\n${approved[0].n} values of ${approvedTargets[0].n} targets.`);
    // The seed's one rejection, with the lead's note (seeds/03-demo-review.ts).
    expect(text).toMatch(/VALUES REJECTED\n1 value\.\n- GW 106: Radial velocity .*Hα sits on a telluric band/);
    expect(text).toContain(`AWAITING REVIEW\n${waiting[0].n} values of ${waitingTargets[0].n} targets wait for the lead astronomer.`);
    // The revised parallax of GW 103 awaits review beside its approved value (seeds/03-demo-review.ts).
    const gw103 = await db('targets').where({ project_id: project.id, designation: 'GW 103' }).first('id');
    expect(text).toMatch(new RegExp(`AWAITING REVIEW[\\s\\S]*- GW 103: [^\\n]*Distance \\(parallax\\)[^\\n]*\\n  http://starledger\\.test/projects/${project.id}/targets/${gw103.id}`));
    // GW 104 is tagged a giant candidate in the seed: its radius does not fit the assumed main sequence, and its two distances disagree.
    expect(text).toMatch(/NEW WARNINGS[\s\S]*- GW 104: Radius [^\n]*outside/);
    expect(text).toMatch(/CROSS-CHECKS THAT DISAGREE[\s\S]*- GW 104: The parallax and photometric distances differ by/);

    // The HTML part carries the same sections, with absolute links to the target sheets.
    expect(mail.html).toContain('Values approved');
    expect(mail.html).toContain(`href="http://starledger.test/projects/${project.id}/targets/${gw103.id}"`);
    expect(mail.html).toContain('href="http://starledger.test/projects/' + project.id + '/review"');
    expect(mail.html).not.toMatch(/<style|<link/);

    const row = await db('mail_outbox').first();
    expect(row).toMatchObject({ status: 'sent', attempts: 1, last_error: null, purpose: 'weekly_summary' });
  });

  it('says in one line that a quiet week had nothing to report', async () => {
    const db = await freshDb();
    await seedDemoIfEmpty(db);
    const project = await db('projects').where({ code: 'GLASSWING' }).first('id');
    await db('derived_values').where({ project_id: project.id, status: 'proposed' }).update({ status: 'superseded' });
    // A month after the season: nothing uploaded, decided or derived in the last seven days.
    const later = { now: () => new Date(Date.now() + 30 * 86_400_000) };
    const preview = await createSummaryService(db, later, { publicUrl: 'http://starledger.test' }).preview(project.id);
    expect(preview.empty).toBe(true);
    const lines = preview.text.split('\n').filter((l) => l.startsWith('Nothing to report'));
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(/^Nothing to report for Glasswing Nearby Dwarfs Programme in .*: no uploads, no decisions, nothing awaiting review and no new warnings\.$/);
    expect(preview.html).not.toContain('<ul');
  });
});

describe('the outbox worker', () => {
  const message = (n: number) => ({
    purpose: 'weekly_summary' as const,
    idempotencyKey: `test:${n}`,
    to: `person${n}@test.invalid`,
    subject: `Message ${n}`,
    html: `<p>Message ${n}</p>`,
    text: `Message ${n}`,
  });

  it('keeps a message queued while the SMTP server is down and delivers it exactly once after it comes back', async () => {
    const db = await freshDb();
    const clock = handClock('2026-12-07T06:00:00.000Z');
    // A free port with nothing listening on it yet.
    const port = await new Promise<number>((resolve) => {
      const probe = net.createServer().listen(0, '127.0.0.1', () => {
        const p = (probe.address() as net.AddressInfo).port;
        probe.close(() => resolve(p));
      });
    });
    const worker = createOutboxWorker({ db, clock, mailer: createSmtpMailer(`smtp://127.0.0.1:${port}`, 'starledger@localhost'), retryBaseMs: 60_000, log: quiet });
    await enqueueMail(db, message(1), clock.now());

    expect(await worker.runOnce()).toEqual({ sent: 0, retried: 1, failed: 0 });
    let row = await db('mail_outbox').first();
    expect(row).toMatchObject({ status: 'queued', attempts: 1, claimed_by: null });
    expect(row.last_error).toMatch(/ECONNREFUSED|connect/i);
    expect(row.next_attempt_at).toBe('2026-12-07T06:01:00.000Z');
    // Not due yet: nothing is tried before the back-off has passed.
    expect(await worker.runOnce()).toEqual({ sent: 0, retried: 0, failed: 0 });

    clock.advance(60_000);
    expect(await worker.runOnce()).toEqual({ sent: 0, retried: 1, failed: 0 });
    row = await db('mail_outbox').first();
    // The second failure waits twice as long.
    expect(row).toMatchObject({ status: 'queued', attempts: 2, next_attempt_at: '2026-12-07T06:03:00.000Z' });

    const smtp = await fake(port);
    clock.advance(120_000);
    expect(await worker.runOnce()).toEqual({ sent: 1, retried: 0, failed: 0 });
    clock.advance(3_600_000);
    expect(await worker.runOnce()).toEqual({ sent: 0, retried: 0, failed: 0 });
    expect(smtp.inbox.messages().map((m) => m.subject)).toEqual(['Message 1']);
    row = await db('mail_outbox').first();
    expect(row).toMatchObject({ status: 'sent', attempts: 3, last_error: null, sent_at: '2026-12-07T06:03:00.000Z' });
  });

  it('gives up after the last attempt and says why', async () => {
    const db = await freshDb();
    const clock = handClock('2026-12-07T06:00:00.000Z');
    const failing = { send: async () => Promise.reject(new Error('550 mailbox unavailable')) };
    const worker = createOutboxWorker({ db, clock, mailer: failing, maxAttempts: 2, retryBaseMs: 1000, log: quiet });
    await enqueueMail(db, message(1), clock.now());
    expect(await worker.runOnce()).toEqual({ sent: 0, retried: 1, failed: 0 });
    clock.advance(1000);
    expect(await worker.runOnce()).toEqual({ sent: 0, retried: 0, failed: 1 });
    clock.advance(86_400_000);
    expect(await worker.runOnce()).toEqual({ sent: 0, retried: 0, failed: 0 });
    expect(await db('mail_outbox').first()).toMatchObject({ status: 'failed', attempts: 2, last_error: '550 mailbox unavailable' });
  });

  it('takes back a claim left by a process that died mid-send, after the claim timeout', async () => {
    const db = await freshDb();
    const clock = handClock('2026-12-07T06:00:00.000Z');
    const smtp = await fake();
    await enqueueMail(db, message(1), clock.now());
    await db('mail_outbox').update({ status: 'sending', attempts: 1, claimed_by: 'a process that died', claimed_at: '2026-12-07T06:00:00.000Z' });
    const worker = createOutboxWorker({ db, clock, mailer: createSmtpMailer(smtp.url, 'starledger@localhost'), claimTimeoutMs: 300_000, log: quiet });
    clock.advance(299_000);
    expect(await worker.runOnce()).toEqual({ sent: 0, retried: 0, failed: 0 });
    clock.advance(2_000);
    expect(await worker.runOnce()).toEqual({ sent: 1, retried: 0, failed: 0 });
    expect(smtp.inbox.messages()).toHaveLength(1);
    expect(await db('mail_outbox').first()).toMatchObject({ status: 'sent', attempts: 2, claimed_by: worker.workerId });
  });

  it('delivers each message once when two worker processes share one database', async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'starledger-outbox-'));
    cleanups.push(() => fs.rmSync(dir, { recursive: true, force: true }));
    const { db, url } = await freshDatabase(`file:${path.join(dir, 'db.sqlite')}`);
    const smtp = await fake();
    const messages = Array.from({ length: 60 }, (_, i) => message(i + 1));
    await db.transaction(async (trx) => {
      for (const m of messages) await enqueueMail(trx, m);
    });
    const script = path.resolve('tests/support/outbox-worker-process.ts');
    const startAt = String(Date.now() + 6000);
    const run = (id: string) =>
      new Promise<{ workerId: string; sent: number }>((resolve, reject) => {
        execFile(process.execPath, ['--import', 'tsx', script, url, smtp.url, id, startAt], { timeout: 60_000 }, (err, stdout, stderr) =>
          err ? reject(new Error(`${id}: ${err.message}\n${stderr}`)) : resolve(JSON.parse(stdout)),
        );
      });
    const results = await Promise.all([run('worker-a'), run('worker-b')]);
    expect(results.reduce((n, r) => n + r.sent, 0)).toBe(messages.length);
    const subjects = smtp.inbox.messages().map((m) => m.subject);
    expect(subjects).toHaveLength(messages.length);
    expect(new Set(subjects).size).toBe(messages.length);
    const rows = await db('mail_outbox').select('status', 'attempts', 'claimed_by');
    expect(rows.every((r) => r.status === 'sent' && r.attempts === 1)).toBe(true);
    // Both processes took part, so the test did exercise the race.
    expect(new Set(rows.map((r) => r.claimed_by))).toEqual(new Set(['worker-a', 'worker-b']));
  }, 90_000);
});
