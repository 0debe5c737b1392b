import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { apiRoutes } from '../../server/routes';
import { createServices } from '../../server/services';
import { createPassport } from '../../server/middleware/auth';
import { createLoginThrottle } from '../../server/modules/auth/login-throttle';
import { createDb } from '../../server/db/knex';
import { systemClock } from '../../server/lib/clock';
import { hashLinkToken } from '../../server/lib/link-tokens';
import { emails, makeWorld, openLink, PASSWORD, proposeValue, signIn, type Session, type Who, type World } from '../support/world';
import { codeAt, enrolSecondFactor } from '../support/second-factor';

type Agent = ReturnType<typeof request.agent>;

/**
 * Walks every API route with every kind of caller and checks the status.
 * The table of who may call what is written here independently of the
 * route declarations (PRODUCT.md, "People and roles"); a route missing from
 * it fails the first test, so new routes must join.
 */
type Caller = Who | 'anonymous';
type Rule = 'public' | 'signed-in' | 'site-admin' | readonly ('lead' | 'observer' | 'reader' | 'pi')[];

const everyone = ['lead', 'observer', 'reader', 'pi'] as const;
const editors = ['lead', 'observer'] as const;
const leads = ['lead'] as const;
const trailReaders = ['lead', 'observer', 'pi'] as const;
const summaryKeepers = ['lead', 'pi'] as const;

interface Case {
  rule: Rule;
  /** A request body a permitted caller would send (it may first put what it names into the world's database, or bring the caller's session to the step the route wants). */
  body?: (w: World, caller: Session | undefined, agent: Agent) => object | Promise<object>;
  query?: string;
  /** Send SAMPLE_FILE as the multipart field `file`. */
  file?: boolean;
}

const cases: Record<string, Case> = {
  'POST /auth/login': { rule: 'public' },
  // The code step after the password of an account with the second factor on (the reader's, enrolled here), a recovery code for the code.
  'POST /auth/login/code': {
    rule: 'public',
    body: async (w, _caller, agent) => {
      const { recoveryCodes } = await enrolSecondFactor(await signIn(w.app, 'reader'), w.clock.now());
      await agent.post('/api/auth/login').send({ email: emails.reader, password: PASSWORD }).expect(200);
      return { code: recoveryCodes[0] };
    },
  },
  'POST /auth/logout': { rule: 'signed-in' },
  'GET /auth/me': { rule: 'signed-in' },
  'POST /auth/password': { rule: 'signed-in', body: () => ({ currentPassword: PASSWORD, password: 'a-new-long-password' }) },
  'GET /openapi.json': { rule: 'signed-in' },
  'GET /auth/sessions': { rule: 'signed-in' },
  'POST /auth/sessions/end-others': { rule: 'signed-in', body: () => ({ currentPassword: PASSWORD }) },
  'DELETE /auth/sessions/:sessionId': { rule: 'signed-in', body: () => ({ currentPassword: PASSWORD }) },
  'GET /auth/second-factor': { rule: 'signed-in' },
  'POST /auth/second-factor/setup': { rule: 'signed-in' },
  'POST /auth/second-factor/confirm': {
    rule: 'signed-in',
    body: async (w, caller) => {
      if (!caller) return { code: '123456' };
      const setup = await caller.agent.post('/api/auth/second-factor/setup').set('X-CSRF-Token', caller.csrf).expect(200);
      return { currentPassword: PASSWORD, code: codeAt(setup.body.secret, w.clock.now()) };
    },
  },
  // Turning it off wants the password and a code: a recovery code, as the enrolment took this 30-second step's code.
  'POST /auth/second-factor/off': {
    rule: 'signed-in',
    body: async (w, caller) => (caller ? { currentPassword: PASSWORD, code: (await enrolSecondFactor(caller, w.clock.now())).recoveryCodes[0] } : {}),
  },
  'POST /auth/password-reset': { rule: 'public', body: () => ({ email: emails.reader }) },
  'POST /auth/password-reset/lookup': { rule: 'public', body: async (w) => ({ token: await openLink(w, 'reset') }) },
  'POST /auth/password-reset/complete': { rule: 'public', body: async (w) => ({ token: await openLink(w, 'reset'), password: 'a-new-long-password' }) },
  'POST /invitations/lookup': { rule: 'public', body: async (w) => ({ token: await openLink(w, 'invitation') }) },
  'POST /invitations/accept': { rule: 'public', body: async (w) => ({ token: await openLink(w, 'invitation'), name: 'Invited Person', password: 'a-new-long-password' }) },
  'GET /projects/:projectId/invitations': { rule: leads },
  'POST /projects/:projectId/invitations': { rule: leads, body: () => ({ email: 'invited@test.invalid', role: 'reader' }) },
  'DELETE /projects/:projectId/invitations/:invitationId': { rule: leads },
  'GET /tokens': { rule: 'signed-in' },
  'POST /tokens': { rule: 'signed-in', body: () => ({ name: 'night pipeline', currentPassword: PASSWORD }) },
  'DELETE /tokens/:tokenId': { rule: 'signed-in' },
  'GET /mail-preferences': { rule: 'signed-in' },
  'GET /account/export': { rule: 'signed-in' },
  'GET /admin/mail': { rule: 'site-admin' },
  'GET /admin/mail/:messageId': { rule: 'site-admin' },
  'GET /users': { rule: 'site-admin' },
  'POST /users': { rule: 'site-admin', body: () => ({ email: 'new@test.invalid', name: 'New Person', password: 'long-enough-password', currentPassword: PASSWORD }) },
  'GET /projects': { rule: 'signed-in' },
  'POST /projects': {
    rule: 'site-admin',
    body: () => ({ name: 'New', code: 'NEW', site: { name: 'S', latitudeDeg: 1, longitudeDeg: 2, elevationM: 3, timeZone: 'Etc/UTC' } }),
  },
  'GET /projects/:projectId': { rule: everyone },
  'PATCH /projects/:projectId': { rule: leads, body: () => ({ description: 'Updated.' }) },
  'GET /projects/:projectId/members': { rule: everyone },
  'POST /projects/:projectId/members': { rule: leads, body: () => ({ email: emails.admin, role: 'reader' }) },
  'PATCH /projects/:projectId/members/:userId': { rule: leads, body: () => ({ role: 'observer' }) },
  'DELETE /projects/:projectId/members/:userId': { rule: leads },
  'GET /projects/:projectId/targets': { rule: everyone, query: '?page=1&pageSize=10' },
  'POST /projects/:projectId/targets': { rule: editors, body: () => ({ designation: 'New 1', ra: '01 02 03', dec: '-04 05 06' }) },
  'GET /projects/:projectId/targets/:targetId': { rule: everyone },
  'PATCH /projects/:projectId/targets/:targetId': { rule: editors, body: () => ({ notes: 'Seen again.' }) },
  'DELETE /projects/:projectId/targets/:targetId': { rule: editors },
  'GET /projects/:projectId/targets/:targetId/derived': { rule: everyone },
  'GET /projects/:projectId/targets/:targetId/measurements': { rule: everyone },
  'GET /projects/:projectId/targets/:targetId/spectra': { rule: everyone },
  'GET /projects/:projectId/review-queue': { rule: editors },
  'POST /projects/:projectId/review': { rule: leads, body: async (w) => ({ decision: 'reject', note: 'Wrong star.', items: [{ id: await proposeValue(w), version: 1 }] }) },
  'GET /projects/:projectId/values/export': { rule: everyone, query: '?format=votable&include=proposed' },
  'POST /projects/:projectId/rederive': { rule: editors, body: () => ({}) },
  'GET /projects/:projectId/hr': { rule: everyone, query: '?include=proposed' },
  'GET /projects/:projectId/uploads': { rule: everyone },
  'POST /projects/:projectId/uploads': { rule: editors, file: true },
  'GET /projects/:projectId/uploads/templates/long.csv': { rule: everyone },
  'GET /projects/:projectId/uploads/templates/wide.csv': { rule: everyone },
  'GET /projects/:projectId/uploads/:uploadId': { rule: everyone },
  'GET /projects/:projectId/uploads/:uploadId/rows': { rule: everyone },
  'GET /projects/:projectId/uploads/:uploadId/errors': { rule: everyone },
  'GET /projects/:projectId/uploads/:uploadId/progress': { rule: everyone },
  'GET /projects/:projectId/uploads/:uploadId/file': { rule: everyone },
  'POST /projects/:projectId/uploads/:uploadId/mapping': {
    rule: editors,
    body: () => ({ mapping: { layout: 'long', columns: { target: { role: 'field', field: 'target' }, quantity: { role: 'field', field: 'quantity' }, value: { role: 'field', field: 'value' }, unit: { role: 'field', field: 'unit' } } } }),
  },
  'POST /projects/:projectId/uploads/:uploadId/commit': { rule: editors, body: () => ({}) },
  'POST /projects/:projectId/uploads/:uploadId/discard': { rule: editors },
  'GET /projects/:projectId/summary': { rule: summaryKeepers },
  'PATCH /projects/:projectId/summary': { rule: summaryKeepers, body: () => ({ enabled: true, weekday: 5, time: '07:30' }) },
  'GET /projects/:projectId/summary/preview': { rule: summaryKeepers },
  'POST /projects/:projectId/summary/send': { rule: summaryKeepers },
  'PATCH /projects/:projectId/mail-preferences': { rule: everyone, body: () => ({ weeklySummary: true }) },
  'GET /activity': { rule: 'signed-in' },
  'GET /projects/:projectId/trail': { rule: trailReaders, query: '?page=1&pageSize=10' },
  'GET /projects/:projectId/trail/export': { rule: trailReaders, query: '?format=csv' },
};

const SAMPLE_FILE = 'target,quantity,value,unit\nT 1,parallax,12.5,mas\n';

function declaredRoutes() {
  const db = createDb('file::memory:');
  const services = createServices(db, systemClock);
  const routes = apiRoutes(services, createPassport(services.users), createLoginThrottle(db, systemClock));
  void db.destroy();
  return routes.map((r) => `${r.method.toUpperCase()} ${r.path}`);
}

function expected(rule: Rule, caller: Caller): 'ok' | 401 | 403 | 404 {
  if (rule === 'public') return 'ok';
  if (caller === 'anonymous') return 401;
  if (rule === 'signed-in') return 'ok';
  if (rule === 'site-admin') return caller === 'admin' ? 'ok' : 403;
  // Inside a project: not a member → 404 (existence not revealed), member without the right → 403.
  if (caller === 'admin' || caller === 'outsider') return 404;
  return (rule as readonly string[]).includes(caller) ? 'ok' : 403;
}

const callers: Caller[] = ['anonymous', 'outsider', 'admin', 'reader', 'pi', 'observer', 'lead'];
// Each case's world is closed after it: 400-odd open at once would outrun a PostgreSQL server's connections.
let current: World | undefined;
afterEach(async () => {
  await current?.db.destroy();
  current = undefined;
});

describe('access to every API route', () => {
  it('has an access rule in this test for every declared route, and no stale ones', () => {
    expect(declaredRoutes().sort()).toEqual(Object.keys(cases).sort());
  });

  for (const [key, c] of Object.entries(cases)) {
    for (const caller of callers) {
      const want = expected(c.rule, caller);
      it(`${key} as ${caller} → ${want === 'ok' ? '2xx' : want}`, async () => {
        const world = (current = await makeWorld());
        const [method, pattern] = key.split(' ');
        const session = caller === 'anonymous' ? undefined : await signIn(world.app, caller);
        let uploadId = '1';
        if (pattern.includes(':uploadId')) {
          const lead = await signIn(world.app, 'lead');
          const made = await lead.agent
            .post(`/api/projects/${world.projectId}/uploads`)
            .set('X-CSRF-Token', lead.csrf)
            .attach('file', Buffer.from(SAMPLE_FILE), 'night.csv')
            .expect(201);
          uploadId = String(made.body.upload.id);
        }
        let tokenId = '1';
        if (session && pattern.includes(':tokenId')) {
          const made = await session.agent.post('/api/tokens').set('X-CSRF-Token', session.csrf).send({ currentPassword: PASSWORD, name: 'to revoke' }).expect(201);
          tokenId = String(made.body.apiToken.id);
        }
        let sessionId = 'none';
        if (session && pattern.includes(':sessionId')) {
          sessionId = (await session.agent.get('/api/auth/sessions').expect(200)).body.sessions[0].id;
        }
        let invitationId = '1';
        if (pattern.includes(':invitationId')) {
          const [made] = await world.db('invitations').where('token_hash', hashLinkToken(await openLink(world, 'invitation'))).select('id');
          invitationId = String(made.id);
        }
        let messageId = '1';
        if (pattern.includes(':messageId')) {
          messageId = String(world.mailInbox.add({ from: 'starledger@localhost', to: [emails.pi], subject: 'Caught', text: 'Caught.', html: null, receivedAt: '2026-12-01T03:00:00.000Z' }).id);
        }
        const path =
          '/api' +
          pattern
            .replace(':projectId', String(world.projectId))
            .replace(':targetId', String(world.targetId))
            .replace(':userId', String(world.userIds.observer))
            .replace(':tokenId', tokenId)
            .replace(':uploadId', uploadId)
            .replace(':messageId', messageId)
            .replace(':invitationId', invitationId)
            .replace(':sessionId', sessionId) +
          (c.query ?? '');
        // An anonymous caller's agent starts with no cookie; it keeps one the route's body may bring (the sign-in's code step).
        const agent = session?.agent ?? request.agent(world.app);
        const body = key === 'POST /auth/login' ? { email: emails.reader, password: 'correct-horse-battery' } : await c.body?.(world, session, agent);
        let req = agent[method.toLowerCase() as 'get' | 'post' | 'patch' | 'delete'](path);
        if (session) req = req.set('X-CSRF-Token', session.csrf);
        const res = c.file ? await req.attach('file', Buffer.from(SAMPLE_FILE), 'night.csv') : body ? await req.send(body) : await req;
        if (want === 'ok') {
          expect(res.status, JSON.stringify(res.body)).toBeGreaterThanOrEqual(200);
          expect(res.status, JSON.stringify(res.body)).toBeLessThan(300);
        } else {
          expect(res.status, JSON.stringify(res.body)).toBe(want);
          expect(res.body.error.code).toBeTypeOf('string');
        }
      });
    }
  }
});
