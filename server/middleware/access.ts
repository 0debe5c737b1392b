import type { NextFunction, Request, Response } from 'express';
import { roleCan, type Permission } from '../../shared/schemas/roles';
import type { Db } from '../db/knex';
import { forbidden, notFound, passwordChangeRequired, secondFactorRequired, sessionEnded, unauthenticated } from '../lib/errors';
import { roleInProject } from '../modules/projects/projects.repository';
import type { ProjectAccess } from '../types';

/** Who may call a route: anyone, any signed-in person, a site admin, or a project member holding a permission. */
export type Access = { kind: 'public' } | { kind: 'user'; beforePasswordChange?: true } | { kind: 'siteAdmin' } | { kind: 'project'; permission: Permission };

export const anyone: Access = { kind: 'public' };
export const signedIn: Access = { kind: 'user' };
/** Any signed-in person, also one who must choose a new password first: for their session, sign-out and the change itself. */
export const ownAccount: Access = { kind: 'user', beforePasswordChange: true };
export const siteAdmin: Access = { kind: 'siteAdmin' };
export const inProject = (permission: Permission): Access => ({ kind: 'project', permission });

/**
 * The one gate every route passes. Inside a project a non-member gets 404 —
 * the project's existence is not revealed — and a member without the
 * permission gets 403. An account that must choose a new password first
 * (users.must_change_password) gets 403 password_change_required, with the
 * reason, on every route but those open to anyone and the ownAccount ones.
 * A site admin's route also wants the session to have passed the second
 * factor (403 second_factor_required), unless the app's
 * `adminSecondFactor` is `optional`.
 */
export function requireAccess(db: Db, access: Access) {
  return async (req: Request, res: Response, next: NextFunction) => {
    if (access.kind === 'public') return next();
    if (!req.user) throw typeof res.locals.sessionEnded === 'string' ? sessionEnded(res.locals.sessionEnded) : unauthenticated();
    if (req.user.mustChangePassword && !(access.kind === 'user' && access.beforePasswordChange)) throw passwordChangeRequired(req.user.mustChangePassword);
    if (access.kind === 'user') return next();
    if (access.kind === 'siteAdmin') {
      if (!req.user.isSiteAdmin) throw forbidden('Only a site admin can do that.');
      // Administration needs a session that passed the second factor, unless ADMIN_SECOND_FACTOR=optional (ASVS 4.3.1); an API token never did.
      if (req.app.locals.adminSecondFactor !== 'optional' && !(req.user.secondFactor && req.session?.secondFactorAt)) throw secondFactorRequired(req.user.secondFactor);
      return next();
    }
    const projectId = Number(req.params.projectId);
    if (!Number.isSafeInteger(projectId) || projectId <= 0) throw notFound('No such project.');
    const role = await roleInProject(db, projectId, req.user.id);
    if (!role) throw notFound('No such project.');
    if (!roleCan(role, access.permission)) throw forbidden();
    res.locals.access = { projectId, role } satisfies ProjectAccess;
    next();
  };
}

export function projectAccessOf(res: Response): ProjectAccess {
  return res.locals.access as ProjectAccess;
}
