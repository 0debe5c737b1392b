import request from 'supertest';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { emails, makeWorld, openLink, PASSWORD, signIn, type World } from '../support/world';

let current: World | undefined;
afterEach(async () => {
  vi.restoreAllMocks();
  await current?.db.destroy();
});

const noticesTo = (w: World, to: string) => w.db('mail_outbox').where({ purpose: 'password_changed', to }).orderBy('id');

/** Every part of a queued message a reader or a mail server sees. */
const allOf = (m: { subject: string; html: string; text: string }) => `${m.subject}\n${m.html}\n${m.text}`;

// OWASP ASVS 4.0.3 2.2.3 and 2.5.5: the account is told when its password is changed or reset.
// The world's clock stands at 2026-12-01T03:00:00Z; Intl's en-GB wording of it in UTC is "1 Dec 2026, 03:00".
describe('the notice of a new password', () => {
  it('is queued once to the account after a change on the account page, naming when and how and no password', async () => {
    current = await makeWorld();
    const w = current;
    const s = await signIn(w.app, 'observer');
    const wrong = await s.agent.post('/api/auth/password').set('X-CSRF-Token', s.csrf).send({ currentPassword: 'not-my-password', password: 'quiet nights at the summit' });
    expect(wrong.status).toBe(400);
    expect(await noticesTo(w, emails.observer)).toHaveLength(0);

    await s.agent.post('/api/auth/password').set('X-CSRF-Token', s.csrf).send({ currentPassword: PASSWORD, password: 'quiet nights at the summit' }).expect(200);
    const notices = await noticesTo(w, emails.observer);
    expect(notices).toHaveLength(1);
    const [notice] = notices;
    expect(notice.subject).toBe('Starledger: your password was changed');
    for (const part of [notice.text, notice.html]) {
      expect(part).toContain('Test observer, your Starledger password was changed on 1 Dec 2026, 03:00 UTC, on the account page');
      expect(part).toContain('If this was not you, someone else has your password or can read this mailbox');
      expect(part).toContain('http://localhost:3000/forgot-password');
    }
    // Drawn on the same mail page as the reset and invitation messages (server/mail/mail-look.ts).
    expect(notice.html).toMatch(/^<!doctype html>/);
    expect(notice.html).toContain('Starledger</p>');
    for (const secret of ['quiet nights at the summit', PASSWORD]) expect(allOf(notice)).not.toContain(secret);
    // No other account is told.
    expect(await w.db('mail_outbox').where({ purpose: 'password_changed' }).whereNot({ to: emails.observer })).toHaveLength(0);
  });

  it('is queued once after a completed reset, not for a refused password or a second use of the link', async () => {
    current = await makeWorld();
    const w = current;
    const token = await openLink(w, 'reset', { email: emails.reader });
    await request(w.app).post('/api/auth/password-reset/complete').send({ token, password: 'short' }).expect(400);
    expect(await noticesTo(w, emails.reader)).toHaveLength(0);

    await request(w.app).post('/api/auth/password-reset/complete').send({ token, password: 'a-brand-new-password' }).expect(200);
    await request(w.app).post('/api/auth/password-reset/complete').send({ token, password: 'yet-another-password' }).expect(410);
    const notices = await noticesTo(w, emails.reader);
    expect(notices).toHaveLength(1);
    expect(notices[0].text).toContain('Test reader, your Starledger password was changed on 1 Dec 2026, 03:00 UTC, with a reset link sent to this address.');
    expect(notices[0].text).toContain('If this was not you');
    for (const secret of ['a-brand-new-password', 'yet-another-password', token]) expect(allOf(notices[0])).not.toContain(secret);
  });

  it('shares the change’s transaction: when the notice cannot be queued the password stays as it was', async () => {
    current = await makeWorld();
    const w = current;
    const s = await signIn(w.app, 'observer');
    // The outbox's table gone, queuing the notice fails, and the change must fail with it.
    await w.db.schema.renameTable('mail_outbox', 'mail_outbox_moved');
    vi.spyOn(console, 'error').mockImplementation(() => undefined);
    const res = await s.agent.post('/api/auth/password').set('X-CSRF-Token', s.csrf).send({ currentPassword: PASSWORD, password: 'quiet nights at the summit' });
    expect(res.status).toBe(500);
    await request(w.app).post('/api/auth/login').send({ email: emails.observer, password: 'quiet nights at the summit' }).expect(401);
    await request(w.app).post('/api/auth/login').send({ email: emails.observer, password: PASSWORD }).expect(200);
    await s.agent.get('/api/auth/me').expect(200);
    expect(await w.db('trail_events').where({ action: 'user.password_changed' })).toHaveLength(0);
  });
});
