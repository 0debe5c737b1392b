import type { Request, Response } from 'express';
import { listDerivedQuery } from '../../../shared/schemas/derived';
import { targetParams } from '../../../shared/schemas/params';
import { projectAccessOf } from '../../middleware/access';
import { parsed } from '../../middleware/validate';
import type { Db } from '../../db/knex';
import { notFound } from '../../lib/errors';
import { findTarget } from '../targets/targets.repository';
import { listDerived } from './derivations.repository';
import { listMeasurements, listSpectra } from '../measurements/measurements.repository';

export function derivationsHandlers(db: Db) {
  async function target(res: Response) {
    const { projectId } = projectAccessOf(res);
    const { targetId } = parsed(res, 'params', targetParams);
    if (!(await findTarget(db, projectId, targetId))) throw notFound('No such target in this project.');
    return { projectId, targetId };
  }
  return {
    async derived(_req: Request, res: Response) {
      const { projectId, targetId } = await target(res);
      const all = await listDerived(db, projectId, targetId, parsed(res, 'query', listDerivedQuery).include);
      // Readers (students, guests) see values once the lead has approved them (PRODUCT.md, roles).
      const derived = projectAccessOf(res).role === 'reader' ? all.filter((d) => d.status === 'approved') : all;
      res.json({ derived });
    },
    async spectra(_req: Request, res: Response) {
      const { projectId, targetId } = await target(res);
      res.json({ spectra: await listSpectra(db, projectId, targetId) });
    },
    async measurements(_req: Request, res: Response) {
      const { projectId, targetId } = await target(res);
      res.json({ measurements: await listMeasurements(db, projectId, targetId) });
    },
  };
}
