import type { Knex } from 'knex';
import { systemClock } from '../server/lib/clock';
import { createDerivedValuesService } from '../server/modules/derived-values/derived-values.service';
import { createUploadsService } from '../server/modules/uploads/uploads.service';

/**
 * The lead's first sign-off of the demo season, through the same review
 * service the queue uses (so every decision has its trail entry): the first
 * fourteen targets are approved, one radial velocity is rejected with a note,
 * and a revised parallax for one approved star arrives afterwards, so a
 * newcomer sees approved values, values awaiting review, and a proposal
 * beside the approved value it would replace. Invented, like the season.
 */
const APPROVED = 14;
const REJECTED = { designation: 'GW 106', quantity: 'radial_velocity', note: 'Hα sits on a telluric band in this frame; re-measure before we use it.' };
const REVISED_PARALLAX = 'target,quantity,value,uncertainty,unit,note\nGW 103,parallax,23.781,0.03,mas,revised catalogue parallax\n';

export async function seed(knex: Knex): Promise<void> {
  const project = await knex('projects').where({ code: 'GLASSWING' }).first('id');
  const lead = await knex('users').where({ email: 'lead@demo.invalid' }).first('id');
  const observer = await knex('users').where({ email: 'observer@demo.invalid' }).first('id');
  if (!project || !lead || !observer) return;
  const derived = createDerivedValuesService(knex, systemClock);

  const targets: { id: number; designation: string }[] = await knex('targets').where({ project_id: project.id }).orderBy('designation_key').select('id', 'designation');
  for (const target of targets.slice(0, APPROVED)) {
    const queue = await derived.queue(project.id, { page: 1, pageSize: 200, targetId: target.id, warnings: 'any' });
    const rejected = queue.items.find((i) => target.designation === REJECTED.designation && i.proposed.quantity === REJECTED.quantity);
    if (rejected) await derived.review(project.id, lead.id, { decision: 'reject', note: REJECTED.note, items: [{ id: rejected.proposed.id, version: rejected.proposed.version }] });
    const items = queue.items.filter((i) => i !== rejected).map((i) => ({ id: i.proposed.id, version: i.proposed.version }));
    if (items.length > 0) await derived.review(project.id, lead.id, { decision: 'approve', note: 'First sign-off of the autumn season.', items });
  }

  const uploads = createUploadsService(knex, systemClock);
  const upload = await uploads.preview(project.id, observer.id, { originalname: 'glasswing-parallax-revision.csv', buffer: Buffer.from(REVISED_PARALLAX) }, { kind: 'measurements' });
  if (upload.errorCount > 0) throw new Error(`demo parallax revision has errors: ${JSON.stringify(upload.errors)}`);
  await uploads.commit(project.id, upload.id, observer.id, false);
}
