import type { Request, Response } from 'express';
import { exportValuesQuery, listDerivedQuery, rederiveBody, reviewBody, reviewQueueQuery } from '../../../shared/schemas/derived';
import { hrQuery } from '../../../shared/schemas/hr';
import { targetParams } from '../../../shared/schemas/params';
import { sendDownload } from '../../lib/download';
import { projectAccessOf } from '../../middleware/access';
import { parsed } from '../../middleware/validate';
import type { DerivedValuesService } from './derived-values.service';

export function derivedValuesHandlers(derived: DerivedValuesService) {
  return {
    async list(_req: Request, res: Response) {
      const { projectId, role } = projectAccessOf(res);
      const { targetId } = parsed(res, 'params', targetParams);
      res.json({ derived: await derived.list(projectId, targetId, parsed(res, 'query', listDerivedQuery).include, role) });
    },
    async hr(_req: Request, res: Response) {
      const { projectId, role } = projectAccessOf(res);
      res.json(await derived.hr(projectId, parsed(res, 'query', hrQuery).include, role));
    },
    async queue(_req: Request, res: Response) {
      res.json(await derived.queue(projectAccessOf(res).projectId, parsed(res, 'query', reviewQueueQuery)));
    },
    async review(req: Request, res: Response) {
      res.json(await derived.review(projectAccessOf(res).projectId, req.user!.id, parsed(res, 'body', reviewBody)));
    },
    async exportValues(req: Request, res: Response) {
      const { projectId, role } = projectAccessOf(res);
      await sendDownload(res, await derived.exportValues(projectId, req.user!.id, role, parsed(res, 'query', exportValuesQuery)));
    },
    async rederive(req: Request, res: Response) {
      res.json(await derived.rederive(projectAccessOf(res).projectId, req.user!.id, parsed(res, 'body', rederiveBody).targetId));
    },
  };
}
