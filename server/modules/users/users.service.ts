import type { Db } from '../../db/knex';
import type { Clock } from '../../lib/clock';
import type { CreateUserBody, PasswordChangeReason, User } from '../../../shared/schemas/auth';
import { conflict, notFound } from '../../lib/errors';
import { deleteSessionsOf } from '../auth/sessions.repository';
import { assertAcceptablePassword, decoyHash, hashPassword, needsRehash, passwordProblem, sessionStamp, verifyPassword } from '../../lib/passwords';
import { appendTrail } from '../trail/trail.repository';
import { queuePasswordChangedMail } from './password-changed-mail';
import {
  findUserByEmail,
  findUserById,
  findUserWithHash,
  insertUser,
  listUsers,
  membershipsOf,
  setMustChangePassword,
  setPasswordHash,
  upgradePasswordHash,
} from './users.repository';

/** `pepper`: the secret password hashes are made with (server/config.ts, passwordPepper); without it hashes are plain scrypt, and peppered ones never match. */
export function createUsersService(db: Db, clock: Clock, options: { publicUrl: string; pepper?: string }) {
  const { pepper } = options;
  return {
    /**
     * Returns the user when the password matches; undefined otherwise,
     * taking the same time whether or not the e-mail exists. A matching
     * password's hash is made again when its scheme is older (no pepper yet,
     * lower parameters: needsRehash), and a password that a new one could no
     * longer be (passwordProblem; ASVS 2.1.7) marks the account as one that
     * must choose a new password before anything else (access.ts).
     */
    async authenticate(email: string, password: string): Promise<User | undefined> {
      const found = await findUserByEmail(db, email);
      if (!found) {
        await verifyPassword(password, await decoyHash);
        return undefined;
      }
      const ok = await verifyPassword(password, found.passwordHash, pepper);
      if (!ok) return undefined;
      const { passwordHash, ...user } = found;
      if (needsRehash(passwordHash, pepper)) await upgradePasswordHash(db, user.id, passwordHash, await hashPassword(password, pepper));
      if (!user.mustChangePassword && passwordProblem(password, user)) {
        await setMustChangePassword(db, user.id, 'weak');
        return { ...user, mustChangePassword: 'weak' };
      }
      return user;
    },

    findById: (id: number) => findUserById(db, id),

    /** The stamp a new session of this account carries (see sessionStamp). */
    async sessionStampOf(id: number): Promise<string | undefined> {
      const found = await findUserWithHash(db, id);
      return found ? sessionStamp(found.passwordHash) : undefined;
    },

    /** The account a session names, if the session was opened with its current password. */
    async findForSession(id: number, stamp: string | undefined): Promise<User | undefined> {
      const found = await findUserWithHash(db, id);
      if (!found || !stamp || sessionStamp(found.passwordHash) !== stamp) return undefined;
      const { passwordHash: _omit, ...user } = found;
      return user;
    },
    memberships: (userId: number) => membershipsOf(db, userId),
    list: () => listUsers(db),

    /**
     * Sets a signed-in person's new password (the caller has checked the
     * current one) and ends every session of the account, in one
     * transaction; the caller opens a new session for the browser that
     * asked, which carries the new password's stamp. The account's
     * address is sent a notice of the change in the same transaction.
     */
    async changePassword(userId: number, password: string): Promise<void> {
      const found = await findUserWithHash(db, userId);
      if (!found) throw notFound('No such account.');
      assertAcceptablePassword(password, found);
      const passwordHash = await hashPassword(password, pepper);
      const now = clock.now();
      await db.transaction(async (trx) => {
        await setPasswordHash(trx, userId, passwordHash, now);
        const ended = await deleteSessionsOf(trx, userId);
        await appendTrail(trx, { projectId: null, actorUserId: userId, action: 'user.password_changed', entityType: 'user', entityId: userId, after: { sessionsEnded: ended } }, now);
        await queuePasswordChangedMail(trx, found, passwordHash, 'change', now, options.publicUrl);
      });
    },

    /**
     * A new account with the password given. `mustChangePassword: 'initial'`
     * when someone other than its owner chose it (a site admin under
     * Accounts; ASVS 2.3.1): its owner must choose their own at the first
     * sign-in. The console's admin:create, where the owner types it, does not.
     */
    async create(input: CreateUserBody, actorUserId: number | null, mark: { mustChangePassword?: PasswordChangeReason } = {}): Promise<User> {
      if (await findUserByEmail(db, input.email)) {
        throw conflict('An account with that e-mail already exists.', [{ path: 'email', message: 'Already in use.' }]);
      }
      assertAcceptablePassword(input.password, input);
      const passwordHash = await hashPassword(input.password, pepper);
      return db.transaction(async (trx) => {
        const user = await insertUser(trx, { ...input, passwordHash, mustChangePassword: mark.mustChangePassword }, clock.now());
        await appendTrail(
          trx,
          { projectId: null, actorUserId, action: 'user.created', entityType: 'user', entityId: user.id, after: user },
          clock.now(),
        );
        return user;
      });
    },
  };
}

export type UsersService = ReturnType<typeof createUsersService>;
