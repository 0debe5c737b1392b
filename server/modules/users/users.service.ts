import type { Db } from '../../db/knex';
import type { Clock } from '../../lib/clock';
import type { CreateUserBody, User } from '../../../shared/schemas/auth';
import { conflict, notFound } from '../../lib/errors';
import { deleteSessionsOf } from '../auth/sessions.repository';
import { assertAcceptablePassword, decoyHash, hashPassword, sessionStamp, verifyPassword } from '../../lib/passwords';
import { appendTrail } from '../trail/trail.repository';
import { queuePasswordChangedMail } from './password-changed-mail';
import { findUserByEmail, findUserById, findUserWithHash, insertUser, listUsers, membershipsOf, setPasswordHash } from './users.repository';

export function createUsersService(db: Db, clock: Clock, options: { publicUrl: string }) {
  return {
    /** Returns the user when the password matches; undefined otherwise, taking the same time whether or not the e-mail exists. */
    async authenticate(email: string, password: string): Promise<User | undefined> {
      const found = await findUserByEmail(db, email);
      if (!found) {
        await verifyPassword(password, await decoyHash);
        return undefined;
      }
      const ok = await verifyPassword(password, found.passwordHash);
      if (!ok) return undefined;
      const { passwordHash: _omit, ...user } = found;
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
      const passwordHash = await hashPassword(password);
      const now = clock.now();
      await db.transaction(async (trx) => {
        await setPasswordHash(trx, userId, passwordHash, now);
        const ended = await deleteSessionsOf(trx, userId);
        await appendTrail(trx, { projectId: null, actorUserId: userId, action: 'user.password_changed', entityType: 'user', entityId: userId, after: { sessionsEnded: ended } }, now);
        await queuePasswordChangedMail(trx, found, passwordHash, 'change', now, options.publicUrl);
      });
    },

    async create(input: CreateUserBody, actorUserId: number | null): Promise<User> {
      if (await findUserByEmail(db, input.email)) {
        throw conflict('An account with that e-mail already exists.', [{ path: 'email', message: 'Already in use.' }]);
      }
      assertAcceptablePassword(input.password, input);
      const passwordHash = await hashPassword(input.password);
      return db.transaction(async (trx) => {
        const user = await insertUser(trx, { ...input, passwordHash }, clock.now());
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
