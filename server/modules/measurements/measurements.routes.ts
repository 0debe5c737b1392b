import type { Request, Response } from 'express';
import { targetParams } from '../../../shared/schemas/params';
import { projectAccessOf } from '../../middleware/access';
import { parsed } from '../../middleware/validate';
import type { MeasurementsService } from './measurements.service';

export function measurementsHandlers(measurements: MeasurementsService) {
  return {
    async list(_req: Request, res: Response) {
      const { targetId } = parsed(res, 'params', targetParams);
      res.json({ measurements: await measurements.list(projectAccessOf(res).projectId, targetId) });
    },
    async spectra(_req: Request, res: Response) {
      const { targetId } = parsed(res, 'params', targetParams);
      res.json({ spectra: await measurements.spectra(projectAccessOf(res).projectId, targetId) });
    },
  };
}
