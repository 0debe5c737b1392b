import type { Request, Response } from 'express';
import { createTargetBody, listTargetsQuery, updateTargetBody } from '../../../shared/schemas/targets';
import { targetParams } from '../../../shared/schemas/params';
import { projectAccessOf } from '../../middleware/access';
import { parsed } from '../../middleware/validate';
import type { TargetsService } from './targets.service';

export function targetsHandlers(targets: TargetsService) {
  return {
    async list(_req: Request, res: Response) {
      const { projectId, role } = projectAccessOf(res);
      res.json(await targets.list(projectId, role, parsed(res, 'query', listTargetsQuery)));
    },
    async create(req: Request, res: Response) {
      const target = await targets.create(projectAccessOf(res).projectId, parsed(res, 'body', createTargetBody), req.user!.id);
      res.status(201).json({ target });
    },
    async get(_req: Request, res: Response) {
      const { targetId } = parsed(res, 'params', targetParams);
      res.json({ target: await targets.get(projectAccessOf(res).projectId, targetId) });
    },
    async update(req: Request, res: Response) {
      const { targetId } = parsed(res, 'params', targetParams);
      const target = await targets.update(projectAccessOf(res).projectId, targetId, parsed(res, 'body', updateTargetBody), req.user!.id);
      res.json({ target });
    },
    async remove(req: Request, res: Response) {
      const { targetId } = parsed(res, 'params', targetParams);
      await targets.remove(projectAccessOf(res).projectId, targetId, req.user!.id);
      res.status(204).end();
    },
  };
}
