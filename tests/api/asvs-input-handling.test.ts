import type { AddressInfo } from 'node:net';
import request from 'supertest';
import { SMTPServer } from 'smtp-server';
import { afterEach, describe, expect, it } from 'vitest';
import { createSmtpMailer } from '../../server/mail/mailer';
import { invitationMail } from '../../server/modules/invitations/invitation-mail';
import { emails, makeWorld, PASSWORD, signIn, type World } from '../support/world';

let world: World;
const cleanups: (() => unknown)[] = [];
afterEach(async () => {
  for (const c of cleanups.splice(0)) await c();
  await world?.db.destroy();
});

const targetsUrl = (w: World) => `/api/projects/${w.projectId}/targets`;
const CRLF_BCC = '\r\nBcc: intruder@elsewhere.invalid';

/** An SMTP server on loopback that keeps each message exactly as it arrived, headers and all. */
async function rawSmtp(): Promise<{ url: string; raw: string[]; recipients: string[][] }> {
  const raw: string[] = [];
  const recipients: string[][] = [];
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => {
        raw.push(Buffer.concat(chunks).toString());
        recipients.push(session.envelope.rcptTo.map((r) => r.address));
        callback();
      });
    },
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  cleanups.push(() => new Promise((resolve) => server.close(() => resolve(undefined))));
  return { url: `smtp://127.0.0.1:${(server.server.address() as AddressInfo).port}`, raw, recipients };
}

const headerBlock = (message: string) => message.split('\r\n\r\n')[0];

// Each check names the OWASP ASVS 4.0.3 requirement it stands for (docs/security.md).
describe('free text', () => {
  it('notes are capped at 4,000 characters, refused past it naming the field, and a body past 1 MB is refused whole (ASVS 5.2.2)', async () => {
    world = await makeWorld();
    const { agent, csrf } = await signIn(world.app, 'observer');
    const base = { designation: 'Capped 1', ra: '01 00 00', dec: '+01 00 00' };
    const over = await agent.post(targetsUrl(world)).set('X-CSRF-Token', csrf).send({ ...base, notes: 'n'.repeat(4001) });
    expect(over.status).toBe(400);
    expect(over.body.error.details.map((d: { path: string }) => d.path)).toEqual(['notes']);
    const at = await agent.post(targetsUrl(world)).set('X-CSRF-Token', csrf).send({ ...base, notes: 'n'.repeat(4000) });
    expect(at.status, JSON.stringify(at.body)).toBe(201);
    const huge = await agent.post(targetsUrl(world)).set('X-CSRF-Token', csrf).send({ ...base, designation: 'Capped 2', notes: 'n'.repeat(1024 * 1024) });
    expect(huge.status).toBe(413);
    expect(await world.db('targets').where({ designation: 'Capped 2' }).first()).toBeUndefined();
  });

  it('quotes, backslashes, </script> and line separators in notes come back as the same JSON string, adding no key (ASVS 5.3.6)', async () => {
    world = await makeWorld();
    const { agent, csrf } = await signIn(world.app, 'observer');
    const notes = 'a "quote", a \\ backslash, "}, "isSiteAdmin": true, {"x": "</script><script>alert(1)</script> \u2028 \u2029 end';
    // U+0000 is refused on the field on both engines (PostgreSQL's text cannot hold it; PostgreSQL manual, §8.3 Character Types), and nothing is made.
    const nul = await agent.post(targetsUrl(world)).set('X-CSRF-Token', csrf).send({ designation: 'Quoted 0', ra: '01 00 00', dec: '+01 00 00', notes: `${notes} \u0000` });
    expect(nul.status).toBe(400);
    expect(nul.body.error.details).toEqual([{ path: 'notes', message: expect.stringMatching(/NUL character/) }]);
    expect(await world.db('targets').where({ designation: 'Quoted 0' }).first()).toBeUndefined();
    const made = await agent.post(targetsUrl(world)).set('X-CSRF-Token', csrf).send({ designation: 'Quoted 1', ra: '01 00 00', dec: '+01 00 00', notes });
    expect(made.status, JSON.stringify(made.body)).toBe(201);
    const read = await agent.get(`${targetsUrl(world)}/${made.body.target?.id ?? made.body.id}`).expect(200);
    expect(read.headers['content-type']).toMatch(/^application\/json/);
    // Parsed by the standard parser (ECMA-404), the text is one string equal to what was sent.
    const body = JSON.parse(read.text);
    const target = body.target ?? body;
    expect(target.notes).toBe(notes);
    expect(target).not.toHaveProperty('isSiteAdmin');
    expect(target).not.toHaveProperty('x');
  });
});

describe('objects from a request body', () => {
  it('__proto__ and constructor.prototype keys in JSON pollute no prototype and set nothing (ASVS 5.5.3)', async () => {
    world = await makeWorld();
    const { agent, csrf } = await signIn(world.app, 'observer');
    const text = '{"designation":"Proto 1","ra":"01 00 00","dec":"+01 00 00","__proto__":{"polluted":"yes","isSiteAdmin":true},"constructor":{"prototype":{"polluted2":"yes"}}}';
    const res = await agent.post(targetsUrl(world)).set('X-CSRF-Token', csrf).set('Content-Type', 'application/json').send(text);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const patched = await agent
      .patch(`${targetsUrl(world)}/${world.targetId}`)
      .set('X-CSRF-Token', csrf)
      .set('Content-Type', 'application/json')
      .send('{"notes":"patched","__proto__":{"polluted3":"yes"},"constructor":{"prototype":{"polluted4":"yes"}}}');
    expect(patched.status, JSON.stringify(patched.body)).toBeLessThan(300);
    // A CSV whose header names __proto__ is read as a table, not into objects that reach a prototype.
    const upload = await agent
      .post(`/api/projects/${world.projectId}/uploads`)
      .set('X-CSRF-Token', csrf)
      .attach('file', Buffer.from('target,quantity,value,unit,__proto__,constructor\nT 1,parallax,12.5,mas,{"polluted5":1},x\n'), 'proto.csv');
    expect(upload.status).toBeLessThan(500);
    const plain: Record<string, unknown> = {};
    for (const key of ['polluted', 'polluted2', 'polluted3', 'polluted4', 'polluted5', 'isSiteAdmin']) expect(plain[key], key).toBeUndefined();
    const me = await agent.get('/api/auth/me').expect(200);
    expect(me.body.user.isSiteAdmin).toBe(false);
    const stored = await world.db('targets').where({ designation: 'Proto 1' }).first();
    expect(JSON.stringify(stored)).not.toContain('polluted');
  });
});

describe('mail built from what people typed', () => {
  it('an address with CR/LF in it is refused naming the field, and nothing is queued (ASVS 5.2.3)', async () => {
    world = await makeWorld();
    const reset = await request(world.app).post('/api/auth/password-reset').send({ email: `${emails.reader}${CRLF_BCC}` });
    expect(reset.status).toBe(400);
    expect(reset.body.error.details.map((d: { path: string }) => d.path)).toEqual(['email']);
    const lead = await signIn(world.app, 'lead');
    const invite = await lead.agent.post(`/api/projects/${world.projectId}/invitations`).set('X-CSRF-Token', lead.csrf).send({ email: `new@test.invalid${CRLF_BCC}`, role: 'reader' });
    expect(invite.status).toBe(400);
    expect(invite.body.error.details.map((d: { path: string }) => d.path)).toEqual(['email']);
    expect(Number((await world.db('mail_outbox').count('* as n').first())?.n)).toBe(0);
  });

  it('a project or person’s name with CR/LF in the subject adds no header and no recipient: nodemailer folds it into the one Subject (ASVS 5.2.3; RFC 5322 §2.2)', async () => {
    const smtp = await rawSmtp();
    const mailer = createSmtpMailer(smtp.url, 'starledger@test.invalid');
    const mail = invitationMail({
      projectName: `Night Survey${CRLF_BCC}\r\nX-Injected: yes`,
      projectCode: 'NS',
      role: 'reader',
      inviterName: `Wren${CRLF_BCC}`,
      href: 'http://starledger.test.invalid/invitation#token',
      expiresAt: new Date('2026-12-08T00:00:00Z'),
    });
    await mailer.send({ to: 'invitee@test.invalid', ...mail });
    expect(smtp.recipients).toEqual([['invitee@test.invalid']]);
    const headers = headerBlock(smtp.raw[0]);
    const names = headers.split('\r\n').filter((l) => !/^[ \t]/.test(l)).map((l) => l.split(':')[0].toLowerCase());
    expect(names).not.toContain('bcc');
    expect(names).not.toContain('x-injected');
    expect(names.filter((n) => n === 'subject')).toHaveLength(1);
  });

  it('braces, ${…} and markup in a name reach the mail as text: escaped in the HTML, never evaluated (ASVS 5.2.5)', () => {
    const hostile = '{{7*7}} ${7*7} <%= 7*7 %> <b onmouseover="x">Wren</b> & co';
    const mail = invitationMail({ projectName: 'Night Survey', projectCode: 'NS', role: 'reader', inviterName: hostile, href: 'http://starledger.test.invalid/invitation#token', expiresAt: new Date('2026-12-08T00:00:00Z') });
    expect(mail.text).toContain(hostile);
    expect(mail.html).toContain('{{7*7}} ${7*7} &lt;%= 7*7 %&gt; &lt;b onmouseover=&quot;x&quot;&gt;Wren&lt;/b&gt; &amp; co');
    expect(mail.html).not.toContain('<b onmouseover');
    expect(mail.html).not.toContain('49');
    expect(mail.text).not.toContain('49');
  });
});

describe('how requests are read', () => {
  it('one JSON reading: a body in a charset outside UTF (latin1) is refused 415, and a key sent twice means what JSON.parse makes of it, the last (ASVS 13.1.1)', async () => {
    world = await makeWorld();
    const { agent, csrf } = await signIn(world.app, 'observer');
    const latin = await agent
      .post(targetsUrl(world))
      .set('X-CSRF-Token', csrf)
      .set('Content-Type', 'application/json; charset=latin1')
      .send(Buffer.from('{"designation":"Charset 1","ra":"01 00 00","dec":"+01 00 00","notes":"Château"}', 'latin1'));
    expect(latin.status, JSON.stringify(latin.body)).toBe(415);
    const text = '{"designation":"Twice A","ra":"01 00 00","dec":"+01 00 00","designation":"Twice B"}';
    const twice = await agent.post(targetsUrl(world)).set('X-CSRF-Token', csrf).set('Content-Type', 'application/json').send(text);
    expect(twice.status, JSON.stringify(twice.body)).toBe(201);
    expect(JSON.parse(text).designation).toBe('Twice B');
    expect(await world.db('targets').whereIn('designation', ['Twice A', 'Twice B']).pluck('designation')).toEqual(['Twice B']);
  });

  it('the one cookie the server sets is the session; a write needs only it, its CSRF header and its body (ASVS 8.1.3)', async () => {
    world = await makeWorld();
    const agent = request.agent(world.app);
    const seen = new Set<string>();
    const note = (res: request.Response) => {
      for (const c of (res.headers['set-cookie'] as unknown as string[] | undefined) ?? []) seen.add(c.split('=')[0]);
      return res;
    };
    const login = note(await agent.post('/api/auth/login').send({ email: emails.observer, password: PASSWORD }).expect(200));
    note(await agent.get('/api/auth/me').expect(200));
    note(await agent.get(targetsUrl(world)).expect(200));
    const write = note(await agent.post(targetsUrl(world)).set('X-CSRF-Token', login.body.csrfToken).send({ designation: 'Lean 1', ra: '01 00 00', dec: '+01 00 00' }));
    expect(write.status).toBe(201);
    note(await agent.post('/api/auth/logout').set('X-CSRF-Token', login.body.csrfToken).expect(204));
    expect([...seen]).toEqual(['starledger.sid']);
  });

  it('a cookie write is judged by its CSRF token, not by Origin: a foreign Origin with the token passes, our own Origin without it is refused (ASVS 14.5.2)', async () => {
    world = await makeWorld();
    const { agent, csrf } = await signIn(world.app, 'observer');
    const body = { designation: 'Origin 1', ra: '01 00 00', dec: '+01 00 00' };
    const foreign = await agent.post(targetsUrl(world)).set('Origin', 'https://elsewhere.invalid').set('X-CSRF-Token', csrf).send(body);
    expect(foreign.status, JSON.stringify(foreign.body)).toBe(201);
    const own = await agent.post(targetsUrl(world)).set('Origin', 'http://127.0.0.1').set('Host', '127.0.0.1').send({ ...body, designation: 'Origin 2' });
    expect(own.status).toBe(403);
    const wrong = await agent.post(targetsUrl(world)).set('Origin', 'http://127.0.0.1').set('X-CSRF-Token', `${csrf}x`).send({ ...body, designation: 'Origin 3' });
    expect(wrong.status).toBe(403);
    expect(await world.db('targets').whereIn('designation', ['Origin 2', 'Origin 3']).pluck('designation')).toEqual([]);
  });
});
