import type { Db } from '../../db/knex';
import { deriveAll, type DerivedResult } from '../../../shared/physics/derive';
import { engineInputsFor } from '../measurements/measurements.repository';
import { insertDerivedRows, latestRevisions, markSuperseded, type DerivedRow, type NewDerivedRow } from './derivations.repository';

function sameAs(row: DerivedRow, r: DerivedResult): boolean {
  return (
    row.value === r.value &&
    row.uncertainty === r.uncertainty &&
    row.label === (r.label ?? null) &&
    row.method === r.method.id &&
    row.inputs_json === JSON.stringify(r.inputs) &&
    row.warnings_json === JSON.stringify(r.warnings)
  );
}

/**
 * Re-derives the given targets from all their measurements and proposes a
 * new revision of every quantity whose value, inputs or warnings changed.
 * An earlier proposal that was never reviewed is superseded by the new one;
 * an approved value stays approved until the lead approves its successor.
 * Runs inside the caller's transaction.
 */
export async function rederiveTargets(
  trx: Db,
  projectId: number,
  targetIds: number[],
  actorUserId: number,
  at: Date,
): Promise<{ proposed: number }> {
  if (targetIds.length === 0) return { proposed: 0 };
  const inputs = await engineInputsFor(trx, targetIds);
  const latest = await latestRevisions(trx, targetIds);
  const toInsert: NewDerivedRow[] = [];
  const toSupersede: number[] = [];
  const created = at.toISOString();
  for (const targetId of targetIds) {
    const graph = deriveAll(inputs.get(targetId) ?? []);
    for (const result of Object.values(graph.results)) {
      if (!result) continue;
      const previous = latest.get(`${targetId}:${result.quantity}`);
      if (previous && previous.status !== 'rejected' && sameAs(previous, result)) continue;
      if (previous?.status === 'proposed') toSupersede.push(previous.id);
      toInsert.push({
        project_id: projectId,
        target_id: targetId,
        quantity: result.quantity,
        value: result.value,
        uncertainty: result.uncertainty,
        unit: result.unit,
        label: result.label ?? null,
        method: result.method.id,
        method_label: result.method.label,
        inputs_json: JSON.stringify(result.inputs),
        constants_json: JSON.stringify(result.constants),
        warnings_json: JSON.stringify(result.warnings),
        revision: (previous?.revision ?? 0) + 1,
        status: 'proposed',
        proposed_by_user_id: actorUserId,
        created_at: created,
      });
    }
  }
  await markSuperseded(trx, toSupersede);
  await insertDerivedRows(trx, toInsert);
  return { proposed: toInsert.length };
}
