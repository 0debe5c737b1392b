import type { Request, Response } from 'express';
import { activityQuery, exportTrailQuery, listTrailQuery } from '../../../shared/schemas/trail';
import { sendDownload } from '../../lib/download';
import { projectAccessOf } from '../../middleware/access';
import { parsed } from '../../middleware/validate';
import type { TrailService } from './trail.service';

export function trailHandlers(trail: TrailService) {
  return {
    async list(_req: Request, res: Response) {
      res.json(await trail.list(projectAccessOf(res).projectId, parsed(res, 'query', listTrailQuery)));
    },

    async export(req: Request, res: Response) {
      const { format, ...filters } = parsed(res, 'query', exportTrailQuery);
      await sendDownload(res, await trail.export(projectAccessOf(res).projectId, req.user!.id, filters, format));
    },

    async activity(req: Request, res: Response) {
      const { limit } = parsed(res, 'query', activityQuery);
      res.json({ items: await trail.activity(req.user!.id, limit) });
    },
  };
}
