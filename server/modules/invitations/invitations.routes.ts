import type { NextFunction, Request, Response } from 'express';
import { linkBody, type User } from '../../../shared/schemas/auth';
import { acceptInvitationBody, createInvitationBody } from '../../../shared/schemas/invitations';
import { idParam } from '../../../shared/schemas/common';
import { projectParams } from '../../../shared/schemas/params';
import { projectAccessOf } from '../../middleware/access';
import { parsed } from '../../middleware/validate';
import { sessionBody } from '../auth/auth.routes';
import type { UsersService } from '../users/users.service';
import type { InvitationsService } from './invitations.service';

export const invitationParams = projectParams.extend({ invitationId: idParam });

export function invitationsHandlers(invitations: InvitationsService, users: UsersService) {
  return {
    async list(_req: Request, res: Response) {
      res.json({ invitations: await invitations.list(projectAccessOf(res).projectId) });
    },
    async create(req: Request, res: Response) {
      const invitation = await invitations.create(projectAccessOf(res).projectId, parsed(res, 'body', createInvitationBody), req.user!.id);
      res.status(201).json({ invitation });
    },
    async revoke(req: Request, res: Response) {
      const { invitationId } = parsed(res, 'params', invitationParams);
      await invitations.revoke(projectAccessOf(res).projectId, invitationId, req.user!.id);
      res.status(204).end();
    },
    async lookup(_req: Request, res: Response) {
      res.json({ invitation: await invitations.lookup(parsed(res, 'body', linkBody).token) });
    },
    /** A new account is signed in at once (a fresh session, as at sign-in); an existing one already is. */
    async accept(req: Request, res: Response, next: NextFunction) {
      const result = await invitations.accept(parsed(res, 'body', acceptInvitationBody), req.user as User | undefined);
      const answer = () => sessionBody(req, users).then((session) => res.status(201).json({ projectId: result.projectId, accountCreated: result.accountCreated, session }), next);
      if (!result.accountCreated) return void answer();
      req.logIn(result.user, (err) => (err ? next(err) : void answer()));
    },
  };
}
