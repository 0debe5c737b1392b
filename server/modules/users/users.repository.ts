import type { Db } from '../../db/knex';
import type { PasswordChangeReason, User } from '../../../shared/schemas/auth';
import type { ProjectRole } from '../../../shared/schemas/roles';

interface UserRow {
  id: number;
  email: string;
  name: string;
  password_hash: string;
  is_site_admin: number | boolean;
  must_change_password: PasswordChangeReason | null;
  totp_enabled_at: unknown;
}

export function toUser(row: UserRow): User {
  return { id: row.id, email: row.email, name: row.name, isSiteAdmin: Boolean(row.is_site_admin), mustChangePassword: row.must_change_password ?? null, secondFactor: row.totp_enabled_at != null };
}

export async function findUserByEmail(db: Db, email: string): Promise<(User & { passwordHash: string }) | undefined> {
  const row = await db<UserRow>('users').where({ email: email.toLowerCase() }).first();
  return row ? { ...toUser(row), passwordHash: row.password_hash } : undefined;
}

export async function findUserWithHash(db: Db, id: number): Promise<(User & { passwordHash: string }) | undefined> {
  const row = await db<UserRow>('users').where({ id }).first();
  return row ? { ...toUser(row), passwordHash: row.password_hash } : undefined;
}

export async function findUserById(db: Db, id: number): Promise<User | undefined> {
  const row = await db<UserRow>('users').where({ id }).first();
  return row ? toUser(row) : undefined;
}

export async function listUsers(db: Db): Promise<User[]> {
  const rows = await db<UserRow>('users').orderBy('name');
  return rows.map(toUser);
}

export async function insertUser(
  db: Db,
  user: { email: string; name: string; passwordHash: string; isSiteAdmin: boolean; mustChangePassword?: PasswordChangeReason },
  at: Date,
): Promise<User> {
  const [row] = await db<UserRow>('users')
    .insert({
      email: user.email.toLowerCase(),
      name: user.name,
      password_hash: user.passwordHash,
      is_site_admin: user.isSiteAdmin,
      must_change_password: user.mustChangePassword ?? null,
      created_at: at.toISOString(),
      updated_at: at.toISOString(),
    } as never)
    .returning('*');
  return toUser(row as UserRow);
}

export async function membershipsOf(db: Db, userId: number): Promise<{ projectId: number; role: ProjectRole }[]> {
  const rows = await db('project_members').where({ user_id: userId }).select('project_id', 'role');
  return rows.map((r: { project_id: number; role: ProjectRole }) => ({ projectId: r.project_id, role: r.role }));
}

/** A new password chosen: the account no longer has to choose one. */
export async function setPasswordHash(db: Db, userId: number, passwordHash: string, at: Date): Promise<void> {
  await db('users').where({ id: userId }).update({ password_hash: passwordHash, must_change_password: null, updated_at: at.toISOString() });
}

/** The same password's hash made again with the newer scheme, unless the hash changed since it was read (a change, or another sign-in's upgrade). */
export async function upgradePasswordHash(db: Db, userId: number, from: string, to: string): Promise<void> {
  await db('users').where({ id: userId, password_hash: from }).update({ password_hash: to });
}

export async function setMustChangePassword(db: Db, userId: number, reason: PasswordChangeReason): Promise<void> {
  await db('users').where({ id: userId }).update({ must_change_password: reason });
}
