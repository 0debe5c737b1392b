import type { Request, Response } from 'express';
import { updateSummaryScheduleBody } from '../../../shared/schemas/mail';
import { projectAccessOf } from '../../middleware/access';
import { parsed } from '../../middleware/validate';
import type { SummaryService } from './summary.service';

export function summaryHandlers(summary: SummaryService) {
  return {
    async settings(_req: Request, res: Response) {
      res.json({ settings: await summary.settings(projectAccessOf(res).projectId) });
    },
    async updateSchedule(req: Request, res: Response) {
      res.json({ settings: await summary.updateSchedule(projectAccessOf(res).projectId, req.user!.id, parsed(res, 'body', updateSummaryScheduleBody)) });
    },
    async preview(_req: Request, res: Response) {
      res.json({ preview: await summary.preview(projectAccessOf(res).projectId) });
    },
    async sendNow(req: Request, res: Response) {
      res.status(202).json({ result: await summary.sendNow(projectAccessOf(res).projectId, req.user!.id) });
    },
  };
}
