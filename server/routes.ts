import { Router, type RequestHandler } from 'express';
import type { z } from 'zod';
import { loginBody, changePasswordBody, createUserBody, completePasswordResetBody, linkBody, passwordResetRequestBody } from '../shared/schemas/auth';
import { addMemberBody, createProjectBody, updateMemberBody, updateProjectBody } from '../shared/schemas/projects';
import { memberParams, projectParams, targetParams } from '../shared/schemas/params';
import { createTargetBody, listTargetsQuery, updateTargetBody } from '../shared/schemas/targets';
import type { Db } from './db/knex';
import { anyone, inProject, ownAccount, requireAccess, signedIn, siteAdmin, type Access } from './middleware/access';
import { validate } from './middleware/validate';
import { requireBodyType } from './middleware/content-type';
import type { StarledgerPassport } from './middleware/auth';
import type { Services } from './services';
import { openApiDocument } from './openapi';
import { authHandlers } from './modules/auth/auth.routes';
import type { LoginThrottle } from './modules/auth/login-throttle';
import { sessionsHandlers } from './modules/auth/sessions.routes';
import { endSessionBody, sessionParams } from '../shared/schemas/sessions';
import { usersHandlers } from './modules/users/users.routes';
import { projectsHandlers } from './modules/projects/projects.routes';
import { membersHandlers } from './modules/members/members.routes';
import { targetsHandlers } from './modules/targets/targets.routes';
import { tokenParams, tokensHandlers } from './modules/tokens/tokens.routes';
import { createTokenBody } from '../shared/schemas/tokens';
import { commitBody, createUploadFields, remapBody, uploadErrorsQuery, uploadParams, uploadRowsQuery } from '../shared/schemas/uploads';
import { hrQuery } from '../shared/schemas/hr';
import { exportValuesQuery, listDerivedQuery, rederiveBody, reviewBody, reviewQueueQuery } from '../shared/schemas/derived';
import { uploadsHandlers } from './modules/uploads/uploads.routes';
import { derivedValuesHandlers } from './modules/derived-values/derived-values.routes';
import { measurementsHandlers } from './modules/measurements/measurements.routes';
import { uploadFile } from './middleware/upload-file';
import { activityQuery, exportTrailQuery, listTrailQuery } from '../shared/schemas/trail';
import { trailHandlers } from './modules/trail/trail.routes';
import { updateMailPreferenceBody, updateSummaryScheduleBody } from '../shared/schemas/mail';
import { summaryHandlers } from './modules/summary/summary.routes';
import { mailPreferencesHandlers } from './modules/mail-preferences/mail-preferences.routes';
import { caughtMailParams, mailFakeHandlers } from './modules/mail-fake/mail-fake.routes';
import { invitationParams, invitationsHandlers } from './modules/invitations/invitations.routes';
import { passwordResetsHandlers } from './modules/password-resets/password-resets.routes';
import { acceptInvitationBody, createInvitationBody } from '../shared/schemas/invitations';
import { confirmSecondFactorBody, signInCodeBody, turnOffSecondFactorBody } from '../shared/schemas/second-factor';
import { secondFactorHandlers } from './modules/second-factor/second-factor.routes';
import { confirmations } from './middleware/confirmation';
import { accountExportHandlers } from './modules/account/account-export.routes';
import { attachmentDisposition } from './lib/download';

type Method = 'get' | 'post' | 'patch' | 'delete';

/** The API's version in its OpenAPI document: raised when a change breaks a pipeline written against it. */
const API_VERSION = '1.0';

export interface RouteDef {
  method: Method;
  path: string;
  access: Access;
  body?: z.ZodType;
  query?: z.ZodType;
  params?: z.ZodType;
  /** Middleware before the access gate (rate limits). */
  before?: RequestHandler[];
  /** Middleware after the access gate and before validation (reading a multipart file). */
  receive?: RequestHandler[];
  /** After validation: the re-authentication a sensitive change carries in its body (server/middleware/confirmation.ts). */
  confirm?: RequestHandler;
  handler: RequestHandler;
}

/**
 * Every API route, in sections; literal paths before `:id` paths. The access
 * test walks this list, so a new route cannot be added without saying who
 * may call it.
 */
export function apiRoutes(services: Services, passport: StarledgerPassport, loginThrottle: LoginThrottle): RouteDef[] {
  const secondFactor = secondFactorHandlers(services.secondFactor, services.users, loginThrottle);
  const auth = authHandlers(passport, services.users, loginThrottle, secondFactor.askForCode);
  const confirm = confirmations(services.users, services.secondFactor, loginThrottle);
  const sessions = sessionsHandlers(services.sessions);
  const users = usersHandlers(services.users);
  const projects = projectsHandlers(services.projects);
  const members = membersHandlers(services.members);
  const targets = targetsHandlers(services.targets);
  const tokens = tokensHandlers(services.tokens);
  const uploads = uploadsHandlers(services.uploads);
  const derived = derivedValuesHandlers(services.derivedValues);
  const measurements = measurementsHandlers(services.measurements);
  const trail = trailHandlers(services.trail);
  const summary = summaryHandlers(services.summary);
  const mailPreferences = mailPreferencesHandlers(services.mailPreferences);
  const mailFake = mailFakeHandlers(services.mailFake);
  const invitations = invitationsHandlers(services.invitations, services.users);
  const passwordResets = passwordResetsHandlers(services.passwordResets);
  const account = accountExportHandlers(services.accountExport);
  const P = '/projects/:projectId';

  // The document is made once, on the first request, from the finished table below.
  let document: ReturnType<typeof openApiDocument> | undefined;
  const routes: RouteDef[] = [
    // This API described (OpenAPI 3.1), generated from this table and its schemas
    {
      method: 'get',
      path: '/openapi.json',
      access: signedIn,
      // Saved under the name the API reference page offers, not the api.json every answer carries.
      handler: (_req, res) => res.set('Content-Disposition', attachmentDisposition('starledger-openapi.json')).json((document ??= openApiDocument(routes, API_VERSION))),
    },

    // Sign-in
    { method: 'post', path: '/auth/login', access: anyone, body: loginBody, handler: auth.login },
    // The code step of a sign-in whose account has the second factor on: only then is the session signed in
    { method: 'post', path: '/auth/login/code', access: anyone, body: signInCodeBody, handler: secondFactor.signIn },
    { method: 'post', path: '/auth/logout', access: ownAccount, handler: auth.logout },
    { method: 'get', path: '/auth/me', access: ownAccount, handler: auth.me },
    // A signed-in person's new password: the current one is asked for, and every other session ends.
    // These three are open to an account that must choose a new password first; every other route refuses it (access.ts).
    { method: 'post', path: '/auth/password', access: ownAccount, body: changePasswordBody, handler: auth.changePassword },
    // A signed-in person's own sessions (where and when they are signed in): listed, and ended one by one or all but this one
    { method: 'get', path: '/auth/sessions', access: signedIn, handler: sessions.list },
    // Ending sessions asks for the password or a code, as a sensitive change does (ASVS 3.3.4)
    { method: 'post', path: '/auth/sessions/end-others', access: signedIn, body: endSessionBody, confirm: confirm('passwordOrCode'), handler: sessions.endOthers },
    { method: 'delete', path: '/auth/sessions/:sessionId', access: signedIn, params: sessionParams, body: endSessionBody, confirm: confirm('passwordOrCode'), handler: sessions.end },
    // The second factor (one-time codes): its state, a secret to enrol, the code that turns it on (with the password), and turning it off (password and code)
    { method: 'get', path: '/auth/second-factor', access: signedIn, handler: secondFactor.status },
    { method: 'post', path: '/auth/second-factor/setup', access: signedIn, handler: secondFactor.begin },
    { method: 'post', path: '/auth/second-factor/confirm', access: signedIn, body: confirmSecondFactorBody, confirm: confirm('passwordOrCode'), handler: secondFactor.confirm },
    { method: 'post', path: '/auth/second-factor/off', access: signedIn, body: turnOffSecondFactorBody, confirm: confirm('passwordAndCode'), handler: secondFactor.turnOff },
    // A forgotten password: the link's token travels in the body, never in a URL that logs keep
    { method: 'post', path: '/auth/password-reset', access: anyone, body: passwordResetRequestBody, handler: passwordResets.request },
    { method: 'post', path: '/auth/password-reset/lookup', access: anyone, body: linkBody, handler: passwordResets.lookup },
    { method: 'post', path: '/auth/password-reset/complete', access: anyone, body: completePasswordResetBody, handler: passwordResets.complete },

    // Accepting an invitation (a new account, or a signed-in existing one)
    { method: 'post', path: '/invitations/lookup', access: anyone, body: linkBody, handler: invitations.lookup },
    { method: 'post', path: '/invitations/accept', access: anyone, body: acceptInvitationBody, handler: invitations.accept },

    // Personal API tokens
    { method: 'get', path: '/tokens', access: signedIn, handler: tokens.list },
    { method: 'post', path: '/tokens', access: signedIn, body: createTokenBody, confirm: confirm('passwordOrCode'), handler: tokens.create },
    { method: 'delete', path: '/tokens/:tokenId', access: signedIn, params: tokenParams, handler: tokens.revoke },

    // Mail preferences (each person's own, per project they belong to)
    { method: 'get', path: '/mail-preferences', access: signedIn, handler: mailPreferences.list },
    // Everything Starledger holds about the caller, as a file to save (ASVS 8.3.2)
    { method: 'get', path: '/account/export', access: signedIn, handler: account.export },

    // The local mail fake's inbox (site admin; 404 when real SMTP is configured)
    { method: 'get', path: '/admin/mail', access: siteAdmin, handler: mailFake.list },
    { method: 'get', path: '/admin/mail/:messageId', access: siteAdmin, params: caughtMailParams, handler: mailFake.get },

    // Accounts (site admin)
    { method: 'get', path: '/users', access: siteAdmin, handler: users.list },
    { method: 'post', path: '/users', access: siteAdmin, body: createUserBody, confirm: confirm('passwordOrCode'), handler: users.create },

    // Projects
    { method: 'get', path: '/projects', access: signedIn, handler: projects.list },
    { method: 'post', path: '/projects', access: siteAdmin, body: createProjectBody, handler: projects.create },
    { method: 'get', path: P, access: inProject('read'), params: projectParams, handler: projects.get },
    { method: 'patch', path: P, access: inProject('manageSettings'), params: projectParams, body: updateProjectBody, handler: projects.update },

    // Members
    { method: 'get', path: `${P}/members`, access: inProject('read'), params: projectParams, handler: members.list },
    { method: 'post', path: `${P}/members`, access: inProject('manageMembers'), params: projectParams, body: addMemberBody, handler: members.add },
    { method: 'patch', path: `${P}/members/:userId`, access: inProject('manageMembers'), params: memberParams, body: updateMemberBody, handler: members.changeRole },
    { method: 'delete', path: `${P}/members/:userId`, access: inProject('manageMembers'), params: memberParams, handler: members.remove },
    { method: 'get', path: `${P}/invitations`, access: inProject('manageMembers'), params: projectParams, handler: invitations.list },
    { method: 'post', path: `${P}/invitations`, access: inProject('manageMembers'), params: projectParams, body: createInvitationBody, handler: invitations.create },
    { method: 'delete', path: `${P}/invitations/:invitationId`, access: inProject('manageMembers'), params: invitationParams, handler: invitations.revoke },

    // Targets
    { method: 'get', path: `${P}/targets`, access: inProject('read'), params: projectParams, query: listTargetsQuery, handler: targets.list },
    { method: 'post', path: `${P}/targets`, access: inProject('editTargets'), params: projectParams, body: createTargetBody, handler: targets.create },
    { method: 'get', path: `${P}/targets/:targetId`, access: inProject('read'), params: targetParams, handler: targets.get },
    { method: 'patch', path: `${P}/targets/:targetId`, access: inProject('editTargets'), params: targetParams, body: updateTargetBody, handler: targets.update },
    { method: 'delete', path: `${P}/targets/:targetId`, access: inProject('editTargets'), params: targetParams, handler: targets.remove },
    { method: 'get', path: `${P}/targets/:targetId/derived`, access: inProject('read'), params: targetParams, query: listDerivedQuery, handler: derived.list },
    { method: 'get', path: `${P}/targets/:targetId/measurements`, access: inProject('read'), params: targetParams, handler: measurements.list },
    { method: 'get', path: `${P}/targets/:targetId/spectra`, access: inProject('read'), params: targetParams, handler: measurements.spectra },

    // Derived values: the review queue, the lead's decisions, re-runs
    { method: 'get', path: `${P}/review-queue`, access: inProject('readQueue'), params: projectParams, query: reviewQueueQuery, handler: derived.queue },
    { method: 'post', path: `${P}/review`, access: inProject('review'), params: projectParams, body: reviewBody, handler: derived.review },
    // Every member may take the values out; readers get approved values only (the service enforces it)
    { method: 'get', path: `${P}/values/export`, access: inProject('read'), params: projectParams, query: exportValuesQuery, handler: derived.exportValues },
    { method: 'post', path: `${P}/rederive`, access: inProject('rederive'), params: projectParams, body: rederiveBody, handler: derived.rederive },
    { method: 'get', path: `${P}/hr`, access: inProject('read'), params: projectParams, query: hrQuery, handler: derived.hr },

    // Uploads
    { method: 'get', path: `${P}/uploads`, access: inProject('read'), params: projectParams, handler: uploads.list },
    { method: 'post', path: `${P}/uploads`, access: inProject('upload'), params: projectParams, receive: [uploadFile], body: createUploadFields, handler: uploads.create },
    { method: 'get', path: `${P}/uploads/templates/long.csv`, access: inProject('read'), params: projectParams, handler: uploads.template('long') },
    { method: 'get', path: `${P}/uploads/templates/wide.csv`, access: inProject('read'), params: projectParams, handler: uploads.template('wide') },
    { method: 'get', path: `${P}/uploads/:uploadId`, access: inProject('read'), params: uploadParams, handler: uploads.get },
    { method: 'get', path: `${P}/uploads/:uploadId/rows`, access: inProject('read'), params: uploadParams, query: uploadRowsQuery, handler: uploads.rows },
    { method: 'get', path: `${P}/uploads/:uploadId/errors`, access: inProject('read'), params: uploadParams, query: uploadErrorsQuery, handler: uploads.errors },
    { method: 'get', path: `${P}/uploads/:uploadId/progress`, access: inProject('read'), params: uploadParams, handler: uploads.progress },
    { method: 'get', path: `${P}/uploads/:uploadId/file`, access: inProject('read'), params: uploadParams, handler: uploads.raw },
    { method: 'post', path: `${P}/uploads/:uploadId/mapping`, access: inProject('upload'), params: uploadParams, body: remapBody, handler: uploads.remap },
    { method: 'post', path: `${P}/uploads/:uploadId/commit`, access: inProject('upload'), params: uploadParams, body: commitBody, handler: uploads.commit },
    { method: 'post', path: `${P}/uploads/:uploadId/discard`, access: inProject('upload'), params: uploadParams, handler: uploads.discard },

    // Weekly summary (PI and lead) and each member's mail preferences for the project
    { method: 'get', path: `${P}/summary`, access: inProject('manageSummary'), params: projectParams, handler: summary.settings },
    { method: 'patch', path: `${P}/summary`, access: inProject('manageSummary'), params: projectParams, body: updateSummaryScheduleBody, handler: summary.updateSchedule },
    { method: 'get', path: `${P}/summary/preview`, access: inProject('manageSummary'), params: projectParams, handler: summary.preview },
    { method: 'post', path: `${P}/summary/send`, access: inProject('manageSummary'), params: projectParams, handler: summary.sendNow },
    { method: 'patch', path: `${P}/mail-preferences`, access: inProject('read'), params: projectParams, body: updateMailPreferenceBody, handler: mailPreferences.update },

    // Review trail (readers are not shown it: it carries values the lead has not approved)
    { method: 'get', path: '/activity', access: signedIn, query: activityQuery, handler: trail.activity },
    { method: 'get', path: `${P}/trail`, access: inProject('readTrail'), params: projectParams, query: listTrailQuery, handler: trail.list },
    { method: 'get', path: `${P}/trail/export`, access: inProject('readTrail'), params: projectParams, query: exportTrailQuery, handler: trail.export },
  ];
  return routes;
}

/** The one media type a route's body is read as: form data beside a file where it receives one, JSON otherwise; none without a body. */
export function bodyMediaType(route: RouteDef): 'application/json' | 'multipart/form-data' | undefined {
  if (!route.body) return undefined;
  return (route.receive?.length ?? 0) > 0 ? 'multipart/form-data' : 'application/json';
}

export function mountRoutes(db: Db, routes: RouteDef[]): Router {
  const router = Router();
  for (const r of routes) {
    const mediaType = bodyMediaType(r);
    const chain: RequestHandler[] = [...(r.before ?? []), requireAccess(db, r.access), ...(mediaType ? [requireBodyType(mediaType)] : []), ...(r.receive ?? [])];
    if (r.params) chain.push(validate('params', r.params));
    if (r.query) chain.push(validate('query', r.query));
    if (r.body) chain.push(validate('body', r.body));
    if (r.confirm) chain.push(r.confirm);
    router[r.method](r.path, ...chain, r.handler);
  }
  return router;
}
