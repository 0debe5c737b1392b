import type { Db } from '../../db/knex';
import type { Invitation } from '../../../shared/schemas/invitations';
import type { ProjectRole } from '../../../shared/schemas/roles';
import { toIso } from '../../lib/rows';

interface InvitationRow {
  id: number;
  project_id: number;
  email: string;
  role: ProjectRole;
  token_hash: string;
  invited_by: number | null;
  invited_by_name: string | null;
  project_name: string;
  project_code: string;
  expires_at: unknown;
  accepted_at: unknown;
  revoked_at: unknown;
  created_at: unknown;
}

export interface StoredInvitation extends Invitation {
  projectId: number;
  projectName: string;
  projectCode: string;
  usedAt: string | null;
  revokedAt: string | null;
}

const isoOrNull = (v: unknown) => (v == null ? null : toIso(v));

function toInvitation(r: InvitationRow): StoredInvitation {
  return {
    id: r.id,
    projectId: r.project_id,
    projectName: r.project_name,
    projectCode: r.project_code,
    email: r.email,
    role: r.role,
    invitedByName: r.invited_by_name,
    createdAt: toIso(r.created_at),
    expiresAt: toIso(r.expires_at),
    usedAt: isoOrNull(r.accepted_at),
    revokedAt: isoOrNull(r.revoked_at),
  };
}

const withNames = (db: Db) =>
  db('invitations as i')
    .join('projects as p', 'p.id', 'i.project_id')
    .leftJoin('users as u', 'u.id', 'i.invited_by')
    .select('i.*', 'u.name as invited_by_name', 'p.name as project_name', 'p.code as project_code');

export async function insertInvitation(
  db: Db,
  inv: { projectId: number; email: string; role: ProjectRole; tokenHash: string; invitedBy: number; expiresAt: Date },
  at: Date,
): Promise<number> {
  const [row] = await db('invitations')
    .insert({
      project_id: inv.projectId,
      email: inv.email,
      role: inv.role,
      token_hash: inv.tokenHash,
      invited_by: inv.invitedBy,
      expires_at: inv.expiresAt.toISOString(),
      created_at: at.toISOString(),
    })
    .returning('id');
  return (row as { id: number }).id;
}

/** Invitations neither accepted, withdrawn nor expired, newest first. */
export async function listPendingInvitations(db: Db, projectId: number, now: Date, email?: string): Promise<StoredInvitation[]> {
  const q = withNames(db)
    .where('i.project_id', projectId)
    .whereNull('i.accepted_at')
    .whereNull('i.revoked_at')
    .where('i.expires_at', '>', now.toISOString())
    .orderBy('i.created_at', 'desc')
    .orderBy('i.id', 'desc');
  if (email) q.where('i.email', email);
  return ((await q) as InvitationRow[]).map(toInvitation);
}

export async function findInvitationByHash(db: Db, tokenHash: string): Promise<StoredInvitation | undefined> {
  const row = (await withNames(db).where('i.token_hash', tokenHash).first()) as InvitationRow | undefined;
  return row ? toInvitation(row) : undefined;
}

/** Marks a pending invitation withdrawn; false when it was not pending (accepted, withdrawn already, or another project's). */
export async function revokeInvitation(db: Db, projectId: number, id: number, at: Date): Promise<boolean> {
  const n = await db('invitations').where({ id, project_id: projectId }).whereNull('accepted_at').whereNull('revoked_at').update({ revoked_at: at.toISOString() });
  return n === 1;
}

/**
 * Takes the invitation for one acceptance: a compare-and-set on its state,
 * so that of two tabs (or two people) using one link exactly one succeeds.
 */
export async function claimInvitation(db: Db, id: number, at: Date): Promise<boolean> {
  const n = await db('invitations')
    .where({ id })
    .whereNull('accepted_at')
    .whereNull('revoked_at')
    .where('expires_at', '>', at.toISOString())
    .update({ accepted_at: at.toISOString() });
  return n === 1;
}

export async function setInvitationAcceptedBy(db: Db, id: number, userId: number): Promise<void> {
  await db('invitations').where({ id }).update({ accepted_by: userId });
}

export async function findInvitation(db: Db, projectId: number, id: number): Promise<StoredInvitation | undefined> {
  const row = (await withNames(db).where({ 'i.id': id, 'i.project_id': projectId }).first()) as InvitationRow | undefined;
  return row ? toInvitation(row) : undefined;
}
