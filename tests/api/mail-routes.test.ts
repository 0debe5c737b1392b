import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { fixedClock } from '../../server/lib/clock';
import { createSummaryService } from '../../server/modules/summary/summary.service';
import { createSummaryScheduler } from '../../server/modules/summary/summary-scheduler';
import { emails, makeWorld, proposeValue, signIn, type World } from '../support/world';

const worlds: World[] = [];
afterEach(async () => {
  for (const w of worlds.splice(0)) await w.db.destroy();
});
async function world(): Promise<World> {
  const w = await makeWorld();
  worlds.push(w);
  return w;
}

const proposedByObserver = (w: World) => proposeValue(w, 'observer');

describe('summary settings', () => {
  it('start at Monday 08:00 in the site’s time zone, name the PI as recipient, and change for the PI', async () => {
    const w = await world();
    const pi = await signIn(w.app, 'pi');
    const res = await pi.agent.get(`/api/projects/${w.projectId}/summary`).expect(200);
    // The world's clock reads Tuesday 2026-12-01 03:00 UTC; the next Monday 08:00 UTC is 7 December.
    expect(res.body.settings).toMatchObject({
      schedule: { enabled: true, weekday: 1, time: '08:00' },
      timeZone: 'Etc/UTC',
      nextRunAt: '2026-12-07T08:00:00.000Z',
      week: '2026-W49',
      weekQueuedAt: null,
      recipients: [{ email: emails.pi, reason: 'pi' }],
    });
    const changed = await pi.agent.patch(`/api/projects/${w.projectId}/summary`).set('X-CSRF-Token', pi.csrf).send({ enabled: true, weekday: 5, time: '17:30' }).expect(200);
    expect(changed.body.settings.nextRunAt).toBe('2026-12-04T17:30:00.000Z');
    const trail = await w.db('trail_events').where({ action: 'summary.schedule_changed' }).first();
    expect(JSON.parse(trail.after_json)).toEqual({ enabled: true, weekday: 5, time: '17:30' });
  });

  it('refuses a time that is not HH:MM and a weekday outside 1–7, naming the field', async () => {
    const w = await world();
    const lead = await signIn(w.app, 'lead');
    const res = await lead.agent.patch(`/api/projects/${w.projectId}/summary`).set('X-CSRF-Token', lead.csrf).send({ enabled: true, weekday: 8, time: '8 am' }).expect(400);
    const paths = res.body.error.details.map((d: { path: string }) => d.path).sort();
    expect(paths).toEqual(['time', 'weekday']);
    expect(await w.db('projects').where({ id: w.projectId }).first('summary_weekday', 'summary_time')).toEqual({ summary_weekday: 1, summary_time: '08:00' });
  });
});

describe('send now and the preview', () => {
  it('queues this week’s summary once per recipient: a second press queues nothing', async () => {
    const w = await world();
    const lead = await signIn(w.app, 'lead');
    const reader = await signIn(w.app, 'reader');
    await reader.agent.patch(`/api/projects/${w.projectId}/mail-preferences`).set('X-CSRF-Token', reader.csrf).send({ weeklySummary: true }).expect(200);
    const first = await lead.agent.post(`/api/projects/${w.projectId}/summary/send`).set('X-CSRF-Token', lead.csrf).expect(202);
    expect(first.body.result).toEqual({ week: '2026-W49', queued: 2, alreadyQueued: 0 });
    const second = await lead.agent.post(`/api/projects/${w.projectId}/summary/send`).set('X-CSRF-Token', lead.csrf).expect(202);
    expect(second.body.result).toEqual({ week: '2026-W49', queued: 0, alreadyQueued: 2 });
    const rows = await w.db('mail_outbox').orderBy('to').select('to', 'idempotency_key', 'purpose');
    expect(rows).toEqual([
      { to: emails.pi, idempotency_key: `weekly_summary:${w.projectId}:2026-W49:${w.userIds.pi}`, purpose: 'weekly_summary' },
      { to: emails.reader, idempotency_key: `weekly_summary:${w.projectId}:2026-W49:${w.userIds.reader}`, purpose: 'weekly_summary' },
    ]);
    const settings = await lead.agent.get(`/api/projects/${w.projectId}/summary`).expect(200);
    expect(settings.body.settings.weekQueuedAt).toBe('2026-12-01T03:00:00.000Z');
  });

  it('queues and records the week once when the lead and the PI press at the same moment (as in two processes)', async () => {
    const w = await world();
    const reader = await signIn(w.app, 'reader');
    await reader.agent.patch(`/api/projects/${w.projectId}/mail-preferences`).set('X-CSRF-Token', reader.csrf).send({ weeklySummary: true }).expect(200);
    // Two services on one database, as in two processes; started together, both look before either has queued.
    const press = (userId: number) => createSummaryService(w.db, fixedClock('2026-12-01T03:00:00.000Z'), { publicUrl: 'http://starledger.test' }).sendNow(w.projectId, userId);
    const presses = await Promise.all([press(w.userIds.lead), press(w.userIds.pi)]);
    // The one whose messages went in says so, the other that they were already queued.
    const results = [...presses].sort((a, b) => b.queued - a.queued);
    expect(results).toEqual([
      { week: '2026-W49', queued: 2, alreadyQueued: 0 },
      { week: '2026-W49', queued: 0, alreadyQueued: 2 },
    ]);
    expect((await w.db('mail_outbox').pluck('to')).sort()).toEqual([emails.pi, emails.reader].sort());
    const trail = await w.db('trail_events').where({ action: 'summary.sent_now' }).select('after_json');
    expect(trail).toHaveLength(1);
    expect(JSON.parse(trail[0].after_json).recipients.sort()).toEqual([emails.pi, emails.reader].sort());
  });

  it('shows a reader’s copy without values awaiting review, which readers are not shown', async () => {
    const w = await world();
    await proposedByObserver(w);
    const reader = await signIn(w.app, 'reader');
    await reader.agent.patch(`/api/projects/${w.projectId}/mail-preferences`).set('X-CSRF-Token', reader.csrf).send({ weeklySummary: true }).expect(200);
    const pi = await signIn(w.app, 'pi');
    const preview = await pi.agent.get(`/api/projects/${w.projectId}/summary/preview`).expect(200);
    expect(preview.body.preview.text).toContain('AWAITING REVIEW\n1 value of 1 target wait for the lead astronomer.');
    await pi.agent.post(`/api/projects/${w.projectId}/summary/send`).set('X-CSRF-Token', pi.csrf).expect(202);
    const readerCopy = await w.db('mail_outbox').where({ to: emails.reader }).first('text');
    expect(readerCopy.text).not.toContain('AWAITING REVIEW');
    expect(readerCopy.text).toContain('Nothing to report');
  });
});

describe('the scheduler', () => {
  it('queues the summary once after the scheduled moment in the site’s time zone, and not days later', async () => {
    const w = await world();
    await w.db('projects').where({ id: w.projectId }).update({ site_time_zone: 'Pacific/Auckland' });
    const tick = (iso: string) => createSummaryScheduler(createSummaryService(w.db, fixedClock(iso), { publicUrl: 'http://starledger.test' }), () => undefined).tick();
    // Monday 08:00 in Auckland (UTC+13 in December) is Sunday 19:00 UTC.
    await tick('2026-12-06T18:59:00.000Z');
    expect(await w.db('mail_outbox').count({ n: '*' }).first()).toMatchObject({ n: 0 });
    await tick('2026-12-06T19:00:30.000Z');
    await tick('2026-12-06T19:01:30.000Z');
    const rows = await w.db('mail_outbox').select('idempotency_key');
    expect(rows).toEqual([{ idempotency_key: `weekly_summary:${w.projectId}:2026-W50:${w.userIds.pi}` }]);
    // A server that was down at the time makes up for it within hours, not on Wednesday.
    await w.db('mail_outbox').del();
    await tick('2026-12-09T02:00:00.000Z');
    expect(await w.db('mail_outbox').count({ n: '*' }).first()).toMatchObject({ n: 0 });
  });
});

describe('mail preferences', () => {
  it('lists each project of mine with my choices; a PI always receives the summary', async () => {
    const w = await world();
    const pi = await signIn(w.app, 'pi');
    const res = await pi.agent.get('/api/mail-preferences').expect(200);
    expect(res.body.preferences).toEqual([
      { projectId: w.projectId, projectName: 'Test programme', projectCode: 'TEST', role: 'pi', weeklySummary: true, summaryAlways: true, reviewNotice: false },
    ]);
    const observer = await signIn(w.app, 'observer');
    const saved = await observer.agent.patch(`/api/projects/${w.projectId}/mail-preferences`).set('X-CSRF-Token', observer.csrf).send({ reviewNotice: true }).expect(200);
    expect(saved.body.preference).toMatchObject({ weeklySummary: false, reviewNotice: true });
    const again = await observer.agent.patch(`/api/projects/${w.projectId}/mail-preferences`).set('X-CSRF-Token', observer.csrf).send({ weeklySummary: true }).expect(200);
    expect(again.body.preference).toMatchObject({ weeklySummary: true, reviewNotice: true });
    const bad = await observer.agent.patch(`/api/projects/${w.projectId}/mail-preferences`).set('X-CSRF-Token', observer.csrf).send({ reviewNotice: 'yes' }).expect(400);
    expect(bad.body.error.details[0].path).toBe('reviewNotice');
  });

  it('mails the proposer who asked for it when the lead rejects their value, in the review’s transaction and once', async () => {
    const w = await world();
    const id = await proposedByObserver(w);
    const observer = await signIn(w.app, 'observer');
    await observer.agent.patch(`/api/projects/${w.projectId}/mail-preferences`).set('X-CSRF-Token', observer.csrf).send({ reviewNotice: true }).expect(200);
    const lead = await signIn(w.app, 'lead');
    await lead.agent
      .post(`/api/projects/${w.projectId}/review`)
      .set('X-CSRF-Token', lead.csrf)
      .send({ decision: 'reject', note: 'Wrong star in the frame.', items: [{ id, version: 1 }] })
      .expect(200);
    const rows = await w.db('mail_outbox').select('to', 'purpose', 'subject', 'text', 'idempotency_key');
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ to: emails.observer, purpose: 'review_notice', subject: 'Starledger: a value of yours rejected in Test programme' });
    expect(rows[0].text).toContain('Test lead rejected a value you proposed in Test programme.');
    expect(rows[0].text).toContain('Note: Wrong star in the frame.');
    expect(rows[0].text).toContain(`- T 1: Distance (parallax) 10.00 ± 0.10 pc`);
    expect(rows[0].text).toContain(`/projects/${w.projectId}/targets/${w.targetId}`);
    // The same decision again is stale and mails nobody.
    await lead.agent.post(`/api/projects/${w.projectId}/review`).set('X-CSRF-Token', lead.csrf).send({ decision: 'reject', note: 'Again.', items: [{ id, version: 1 }] }).expect(409);
    expect(await w.db('mail_outbox').count({ n: '*' }).first()).toMatchObject({ n: 1 });
  });

  it('mails nobody who did not ask', async () => {
    const w = await world();
    const id = await proposedByObserver(w);
    const lead = await signIn(w.app, 'lead');
    await lead.agent.post(`/api/projects/${w.projectId}/review`).set('X-CSRF-Token', lead.csrf).send({ decision: 'approve', note: '', items: [{ id, version: 1 }] }).expect(200);
    expect(await w.db('mail_outbox').count({ n: '*' }).first()).toMatchObject({ n: 0 });
  });
});

describe('the mail fake’s inbox page', () => {
  it('shows the site admin what the fake caught, as text and HTML', async () => {
    const w = await world();
    w.mailInbox.add({ from: 'Starledger <starledger@localhost>', to: [emails.pi], subject: 'Weekly summary', text: 'Nothing to report.', html: '<p>Nothing to report.</p>', receivedAt: '2026-12-01T03:00:00.000Z' });
    const admin = await signIn(w.app, 'admin');
    const list = await admin.agent.get('/api/admin/mail').expect(200);
    expect(list.body.messages).toEqual([{ id: 1, from: 'Starledger <starledger@localhost>', to: [emails.pi], subject: 'Weekly summary', receivedAt: '2026-12-01T03:00:00.000Z', hasHtml: true }]);
    const one = await admin.agent.get('/api/admin/mail/1').expect(200);
    expect(one.body.message).toMatchObject({ text: 'Nothing to report.', html: '<p>Nothing to report.</p>' });
    await admin.agent.get('/api/admin/mail/2').expect(404);
  });

  it('is absent when mail goes to a real SMTP server', async () => {
    const w = await world();
    // The world's site admin has no second factor (as in makeWorld): the mail route's own answer is what is tested here.
    const app = createApp({ db: w.db, sessionSecret: 'test-secret', sessionCleanupIntervalMs: 0, adminSecondFactor: 'optional' });
    const agent = request.agent(app);
    await agent.post('/api/auth/login').send({ email: emails.admin, password: 'correct-horse-battery' }).expect(200);
    const res = await agent.get('/api/admin/mail').expect(404);
    expect(res.body.error.message).toContain('SMTP_URL');
  });
});
