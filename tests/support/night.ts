import type { DerivedValue } from '../../shared/schemas/derived';
import type { Session, World } from './world';

/** One invented night of the world's target T 1: V, B−V, a parallax and a continuum peak (demo-style numbers, not a real star). */
export const NIGHT = [
  'target,quantity,value,uncertainty,unit,band',
  'T 1,magnitude,7.42,0.02,mag,V',
  'T 1,colour_index,0.65,0.02,mag,B-V',
  'T 1,parallax,41.2,0.4,mas,',
  'T 1,peak_wavelength,502,5,nm,',
].join('\n');

/** Uploads a measurement file and commits it whole, as an observer's night would go in. */
export async function commitFile(s: Session, w: World, content: string): Promise<void> {
  const made = await s.agent.post(`/api/projects/${w.projectId}/uploads`).set('X-CSRF-Token', s.csrf).attach('file', Buffer.from(content), 'night.csv').expect(201);
  await s.agent.post(`/api/projects/${w.projectId}/uploads/${made.body.upload.id}/commit`).set('X-CSRF-Token', s.csrf).send({ confirmDuplicate: true }).expect(200);
}

/** The newest revision of each quantity of the world's target, as the target sheet reads it (the route sends newest first). */
export async function newestDerived(s: Session, w: World): Promise<Record<string, DerivedValue>> {
  const res = await s.agent.get(`/api/projects/${w.projectId}/targets/${w.targetId}/derived`).expect(200);
  const out: Record<string, DerivedValue> = {};
  for (const d of res.body.derived as DerivedValue[]) out[d.quantity] ??= d;
  return out;
}
