import { afterEach, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createHash } from 'node:crypto';
import { createSmtpMailer } from '../../server/mail/mailer';
import { startFakeSmtp } from '../../server/mail/fake-smtp';
import { createOutboxWorker } from '../../server/mail/outbox-worker';
import { emails, makeWorld, PASSWORD, signIn, type World } from '../support/world';

const worlds: World[] = [];
const cleanups: (() => Promise<unknown>)[] = [];
afterEach(async () => {
  for (const c of cleanups.splice(0)) await c();
  await Promise.all(worlds.splice(0).map((w) => w.db.destroy()));
});

async function world(): Promise<World> {
  const w = await makeWorld();
  worlds.push(w);
  return w;
}

/** The token of the link in a queued message's plain text. */
function tokenIn(text: string): string {
  const m = /\/invitation#([A-Za-z0-9_-]+)/.exec(text);
  if (!m) throw new Error(`no invitation link in: ${text}`);
  return m[1];
}

async function invite(w: World, email: string, role = 'observer') {
  const lead = await signIn(w.app, 'lead');
  const res = await lead.agent.post(`/api/projects/${w.projectId}/invitations`).set('X-CSRF-Token', lead.csrf).send({ email, role });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  const mail = await w.db('mail_outbox').where({ idempotency_key: `invitation:${res.body.invitation.id}` }).first();
  return { lead, invitation: res.body.invitation, mail, token: tokenIn(mail.text) };
}

describe('inviting someone to a project', () => {
  it('queues one message in Starledger’s look with a single-use link, stores only the token’s SHA-256, lists the invitation and records it in the trail', async () => {
    const w = await world();
    const { lead, invitation, mail, token } = await invite(w, 'New.Person@Test.invalid', 'observer');
    expect(invitation).toMatchObject({ email: 'new.person@test.invalid', role: 'observer', invitedByName: 'Test lead' });
    // 7 days after the world's clock (2026-12-01T03:00Z)
    expect(invitation.expiresAt).toBe('2026-12-08T03:00:00.000Z');
    expect(mail).toMatchObject({ purpose: 'invitation', to: 'new.person@test.invalid', status: 'queued' });
    expect(mail.subject).toContain('Test programme');
    expect(mail.text).toContain('until 8 Dec 2026, 03:00 UTC');
    expect(mail.html).toContain(`/invitation#${token}`);
    expect(mail.html).toContain('Starledger');
    const row = await w.db('invitations').where({ id: invitation.id }).first();
    expect(row.token_hash).toBe(createHash('sha256').update(token).digest('hex'));
    expect(JSON.stringify(row)).not.toContain(token);
    const listed = await lead.agent.get(`/api/projects/${w.projectId}/invitations`).expect(200);
    expect(listed.body.invitations.map((i: { id: number }) => i.id)).toEqual([invitation.id]);
    const trail = await w.db('trail_events').where({ action: 'invitation.created' });
    expect(trail).toHaveLength(1);
    expect(JSON.parse(trail[0].after_json)).toMatchObject({ email: 'new.person@test.invalid', role: 'observer' });
  });

  it('refuses an address that is already a member or already has a waiting invitation, naming the field', async () => {
    const w = await world();
    const lead = await signIn(w.app, 'lead');
    const member = await lead.agent.post(`/api/projects/${w.projectId}/invitations`).set('X-CSRF-Token', lead.csrf).send({ email: emails.reader, role: 'observer' });
    expect(member.status).toBe(409);
    expect(member.body.error.details).toEqual([{ path: 'email', message: 'Already a member.' }]);
    await invite(w, 'twice@test.invalid');
    const again = await lead.agent.post(`/api/projects/${w.projectId}/invitations`).set('X-CSRF-Token', lead.csrf).send({ email: 'twice@test.invalid', role: 'reader' });
    expect(again.status).toBe(409);
    expect(again.body.error.details).toEqual([{ path: 'email', message: 'Already invited.' }]);
    expect(await w.db('mail_outbox').count('* as n').first()).toEqual({ n: 1 });
  });

  it('is delivered over SMTP to the local fake, with the link in the HTML and the text', async () => {
    const w = await world();
    const { token } = await invite(w, 'by-mail@test.invalid');
    const smtp = await startFakeSmtp({});
    cleanups.push(() => smtp.close());
    const worker = createOutboxWorker({ db: w.db, mailer: createSmtpMailer(smtp.url, 'Starledger <starledger@localhost>'), log: () => undefined });
    expect(await worker.runOnce()).toEqual({ sent: 1, retried: 0, failed: 0 });
    const [received] = smtp.inbox.messages();
    expect(received.to).toEqual(['by-mail@test.invalid']);
    expect(received.text).toContain(`/invitation#${token}`);
    expect(received.html).toContain(`/invitation#${token}`);
  });
});

describe('accepting an invitation', () => {
  it('for a new address creates the account with the chosen name and password and the role, signs it in, and the link then works no more', async () => {
    const w = await world();
    const { token } = await invite(w, 'newcomer@test.invalid', 'observer');
    const visitor = request.agent(w.app);
    const seen = await visitor.post('/api/invitations/lookup').send({ token }).expect(200);
    expect(seen.body.invitation).toMatchObject({ projectName: 'Test programme', email: 'newcomer@test.invalid', role: 'observer', accountExists: false, invitedByName: 'Test lead' });

    const accepted = await visitor.post('/api/invitations/accept').send({ token, name: 'Nadia Newcomer', password: 'a-long-new-password' });
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(201);
    expect(accepted.body).toMatchObject({ projectId: w.projectId, accountCreated: true, session: { user: { email: 'newcomer@test.invalid', name: 'Nadia Newcomer' } } });
    const me = await visitor.get('/api/auth/me').expect(200);
    expect(me.body.memberships).toEqual([{ projectId: w.projectId, role: 'observer' }]);
    await request(w.app).post('/api/auth/login').send({ email: 'newcomer@test.invalid', password: 'a-long-new-password' }).expect(200);

    const actions = (await w.db('trail_events').orderBy('id')).map((e: { action: string }) => e.action);
    expect(actions).toEqual(['invitation.created', 'user.created', 'member.added']);

    const reused = await request(w.app).post('/api/invitations/accept').send({ token, name: 'Someone Else', password: 'another-long-password' });
    expect(reused.status).toBe(410);
    expect(reused.body.error.code).toBe('link_used');
    expect(reused.body.error.message).toMatch(/already been accepted/);
    const lookedAgain = await request(w.app).post('/api/invitations/lookup').send({ token });
    expect(lookedAgain.body.error.code).toBe('link_used');
    expect(await w.db('users').where({ email: 'newcomer@test.invalid' }).count('* as n').first()).toEqual({ n: 1 });
  });

  it('for a new address without a name or a password names both fields and leaves the link usable', async () => {
    const w = await world();
    const { token } = await invite(w, 'forgetful@test.invalid');
    const res = await request(w.app).post('/api/invitations/accept').send({ token });
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([
      { path: 'name', message: 'Enter your name.' },
      { path: 'password', message: 'Choose a password.' },
    ]);
    const short = await request(w.app).post('/api/invitations/accept').send({ token, name: 'F', password: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.error.details).toEqual([{ path: 'password', message: 'Use at least 12 characters; a few words together make a good password.' }]);
    await request(w.app).post('/api/invitations/lookup').send({ token }).expect(200);
  });

  it('for an address with an account asks its owner to sign in, refuses another account, and adds the role to the owner', async () => {
    const w = await world();
    // The site admin has an account and is not a member of the world's project.
    const { token } = await invite(w, emails.admin, 'pi');
    const looked = await request(w.app).post('/api/invitations/lookup').send({ token }).expect(200);
    expect(looked.body.invitation.accountExists).toBe(true);

    const anonymous = await request(w.app).post('/api/invitations/accept').send({ token });
    expect(anonymous.status).toBe(401);
    expect(anonymous.body.error.message).toContain(emails.admin);

    const reader = await signIn(w.app, 'reader');
    const wrong = await reader.agent.post('/api/invitations/accept').set('X-CSRF-Token', reader.csrf).send({ token });
    expect(wrong.status).toBe(403);
    expect(wrong.body.error.message).toContain(`signed in as ${emails.reader}`);

    const admin = await signIn(w.app, 'admin');
    const ok = await admin.agent.post('/api/invitations/accept').set('X-CSRF-Token', admin.csrf).send({ token });
    expect(ok.status, JSON.stringify(ok.body)).toBe(201);
    expect(ok.body.accountCreated).toBe(false);
    expect(ok.body.session.memberships).toEqual([{ projectId: w.projectId, role: 'pi' }]);
    // The password was not touched.
    await request(w.app).post('/api/auth/login').send({ email: emails.admin, password: PASSWORD }).expect(200);
    const again = await admin.agent.post('/api/invitations/accept').set('X-CSRF-Token', admin.csrf).send({ token });
    expect(again.body.error.code).toBe('link_used');
  });

  it('refuses a withdrawn invitation, and the lead’s list no longer shows it', async () => {
    const w = await world();
    const { lead, invitation, token } = await invite(w, 'withdrawn@test.invalid');
    await lead.agent.delete(`/api/projects/${w.projectId}/invitations/${invitation.id}`).set('X-CSRF-Token', lead.csrf).expect(204);
    const listed = await lead.agent.get(`/api/projects/${w.projectId}/invitations`).expect(200);
    expect(listed.body.invitations).toEqual([]);
    const res = await request(w.app).post('/api/invitations/accept').send({ token, name: 'W', password: 'a-long-new-password' });
    expect(res.status).toBe(410);
    expect(res.body.error.code).toBe('link_revoked');
    expect(res.body.error.message).toMatch(/withdrawn/);
    const twice = await lead.agent.delete(`/api/projects/${w.projectId}/invitations/${invitation.id}`).set('X-CSRF-Token', lead.csrf);
    expect(twice.status).toBe(409);
    expect((await w.db('trail_events').where({ action: 'invitation.revoked' })).length).toBe(1);
    expect(await w.db('users').where({ email: 'withdrawn@test.invalid' }).first()).toBeUndefined();
  });

  it('refuses an expired invitation and an unknown link, each with its own message', async () => {
    const w = await world();
    const { invitation, token } = await invite(w, 'late@test.invalid');
    await w.db('invitations').where({ id: invitation.id }).update({ expires_at: '2026-12-01T02:59:59.000Z' });
    for (const path of ['/api/invitations/lookup', '/api/invitations/accept']) {
      const res = await request(w.app).post(path).send({ token, name: 'L', password: 'a-long-new-password' });
      expect(res.status).toBe(410);
      expect(res.body.error.code).toBe('link_expired');
      expect(res.body.error.message).toMatch(/expired/);
    }
    const unknown = await request(w.app).post('/api/invitations/lookup').send({ token: 'A'.repeat(43) });
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.code).toBe('link_unknown');
    const cut = await request(w.app).post('/api/invitations/lookup').send({ token: 'abc' });
    expect(cut.status).toBe(400);
    expect(cut.body.error.details[0].path).toBe('token');
  });

  it('lets a lead of another project neither list nor withdraw this project’s invitations', async () => {
    const w = await world();
    const { invitation } = await invite(w, 'private@test.invalid');
    const outsider = await signIn(w.app, 'outsider');
    const res = await outsider.agent.delete(`/api/projects/${w.otherProjectId}/invitations/${invitation.id}`).set('X-CSRF-Token', outsider.csrf);
    expect(res.status).toBe(404);
    expect((await w.db('invitations').where({ id: invitation.id }).first()).revoked_at).toBeNull();
  });
});
