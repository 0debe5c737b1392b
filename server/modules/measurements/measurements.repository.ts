import type { Db } from '../../db/knex';
import type { Measurement } from '../../../shared/schemas/derived';
import type { StoredSpectrum } from '../../../shared/schemas/uploads';
import type { MeasurementInput } from '../../../shared/physics/derive';
import { chunks } from '../../lib/chunks';
import { bulkInsert } from '../../db/bulk-insert';
import { parseJson, toIso } from '../../lib/rows';
import { pointsToDraw } from '../../../shared/schemas/spectrum-drawing';

export interface NewMeasurement {
  projectId: number;
  targetId: number;
  uploadId: number | null;
  rowNumber: number | null;
  kind: string;
  valueSi: number;
  uncertaintySi: number | null;
  unitSi: string;
  valueAsSent: number;
  uncertaintyAsSent: number | null;
  unitAsSent: string | null;
  band: string | null;
  restWavelengthSi: number | null;
  landeG: number | null;
  observedAt: string | null;
  instrument: string | null;
  note: string;
  extra: Record<string, string>;
  observerUserId: number;
}

export async function insertMeasurements(db: Db, rows: NewMeasurement[], at: Date): Promise<void> {
  const created = at.toISOString();
  await bulkInsert(
    db,
    'measurements',
    rows.map((m) => ({
        project_id: m.projectId,
        target_id: m.targetId,
        upload_id: m.uploadId,
        row_number: m.rowNumber,
        kind: m.kind,
        value_si: m.valueSi,
        uncertainty_si: m.uncertaintySi,
        unit_si: m.unitSi,
        value_as_sent: m.valueAsSent,
        uncertainty_as_sent: m.uncertaintyAsSent,
        unit_as_sent: m.unitAsSent,
        band: m.band,
        rest_wavelength_si: m.restWavelengthSi,
        lande_g: m.landeG,
        observed_at: m.observedAt,
        instrument: m.instrument,
        note: m.note,
        extra_json: JSON.stringify(m.extra),
        observer_user_id: m.observerUserId,
        created_at: created,
      })),
  );
}

/** Every measurement of the given targets, in the engine's input form, grouped by target. */
export async function engineInputsFor(db: Db, targetIds: number[]): Promise<Map<number, MeasurementInput[]>> {
  const byTarget = new Map<number, MeasurementInput[]>();
  for (const ids of chunks(targetIds, 500)) {
    // A reading taken from a stored spectrum carries that spectrum's id, so the engine treats one spectrum's readings as one.
    const rows = await db('measurements as m')
      .leftJoin('spectra as s', 's.upload_id', 'm.upload_id')
      .whereIn('m.target_id', ids)
      .orderBy('m.id')
      .select('m.id', 'm.target_id', 'm.kind', 'm.value_si', 'm.uncertainty_si', 'm.band', 'm.rest_wavelength_si', 'm.lande_g', 's.id as spectrum_id');
    for (const r of rows) {
      const list = byTarget.get(r.target_id) ?? [];
      list.push({
        id: r.id,
        kind: r.kind,
        valueSi: r.value_si,
        uncertaintySi: r.uncertainty_si ?? undefined,
        band: r.band ?? undefined,
        restWavelengthSi: r.rest_wavelength_si ?? undefined,
        landeG: r.lande_g ?? undefined,
        spectrumId: r.spectrum_id ?? undefined,
      });
      byTarget.set(r.target_id, list);
    }
  }
  return byTarget;
}

export async function listMeasurements(db: Db, projectId: number, targetId: number): Promise<Measurement[]> {
  const rows = await db('measurements as m')
    .leftJoin('users as u', 'u.id', 'm.observer_user_id')
    .where({ 'm.project_id': projectId, 'm.target_id': targetId })
    .orderBy([{ column: 'm.observed_at', order: 'desc' }, { column: 'm.id', order: 'desc' }])
    .select('m.*', 'u.name as observer_name');
  return rows.map((r) => ({
    id: r.id,
    targetId: r.target_id,
    uploadId: r.upload_id,
    rowNumber: r.row_number,
    kind: r.kind,
    valueSi: r.value_si,
    uncertaintySi: r.uncertainty_si,
    unitSi: r.unit_si,
    valueAsSent: r.value_as_sent,
    uncertaintyAsSent: r.uncertainty_as_sent,
    unitAsSent: r.unit_as_sent,
    band: r.band,
    restWavelengthSi: r.rest_wavelength_si,
    landeG: r.lande_g,
    observedAt: r.observed_at == null ? null : toIso(r.observed_at),
    instrument: r.instrument,
    note: r.note,
    extra: parseJson<Record<string, string>>(r.extra_json, {}),
    observer: r.observer_name ?? null,
    createdAt: toIso(r.created_at),
  }));
}

export async function listSpectra(db: Db, projectId: number, targetId: number): Promise<StoredSpectrum[]> {
  const rows = await db('spectra').where({ project_id: projectId, target_id: targetId }).orderBy('id', 'desc');
  return rows.map((r) => {
    const points = parseJson<[number, number][]>(r.points_json, []);
    return {
      id: r.id,
      uploadId: r.upload_id,
      points: pointsToDraw(points),
      pointCount: points.length,
      fit: parseJson<StoredSpectrum['fit']>(r.fit_json, {} as StoredSpectrum['fit']),
      createdAt: toIso(r.created_at),
    };
  });
}
