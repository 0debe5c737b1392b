import type { Db } from '../../db/knex';
import { notFound } from '../../lib/errors';
import { findTarget } from '../targets/targets.repository';
import { listMeasurements, listSpectra } from './measurements.repository';

/** A target's measurements and spectra, as the target sheet shows them. */
export function createMeasurementsService(db: Db) {
  async function requireTarget(projectId: number, targetId: number) {
    if (!(await findTarget(db, projectId, targetId))) throw notFound('No such target in this project.');
  }
  return {
    async list(projectId: number, targetId: number) {
      await requireTarget(projectId, targetId);
      return listMeasurements(db, projectId, targetId);
    },
    async spectra(projectId: number, targetId: number) {
      await requireTarget(projectId, targetId);
      return listSpectra(db, projectId, targetId);
    },
  };
}

export type MeasurementsService = ReturnType<typeof createMeasurementsService>;
