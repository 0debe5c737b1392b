import type { Request, Response } from 'express';
import { addMemberBody, updateMemberBody } from '../../../shared/schemas/projects';
import { memberParams } from '../../../shared/schemas/params';
import { projectAccessOf } from '../../middleware/access';
import { parsed } from '../../middleware/validate';
import type { MembersService } from './members.service';

export function membersHandlers(members: MembersService) {
  return {
    async list(_req: Request, res: Response) {
      res.json({ members: await members.list(projectAccessOf(res).projectId) });
    },
    async add(req: Request, res: Response) {
      const member = await members.add(projectAccessOf(res).projectId, parsed(res, 'body', addMemberBody), req.user!.id);
      res.status(201).json({ member });
    },
    async changeRole(req: Request, res: Response) {
      const { userId } = parsed(res, 'params', memberParams);
      const { role } = parsed(res, 'body', updateMemberBody);
      res.json({ member: await members.changeRole(projectAccessOf(res).projectId, userId, role, req.user!.id) });
    },
    async remove(req: Request, res: Response) {
      const { userId } = parsed(res, 'params', memberParams);
      await members.remove(projectAccessOf(res).projectId, userId, req.user!.id);
      res.status(204).end();
    },
  };
}
