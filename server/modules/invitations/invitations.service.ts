import type { Db } from '../../db/knex';
import type { Clock } from '../../lib/clock';
import type { User } from '../../../shared/schemas/auth';
import type { AcceptInvitationBody, CreateInvitationBody, Invitation, InvitationLookup } from '../../../shared/schemas/invitations';
import type { FieldIssue } from '../../../shared/errors';
import { AppError, conflict, forbidden, notFound, validationFailed } from '../../lib/errors';
import { expiresAfter, hashLinkToken, linkRefusal, newLinkToken, UNKNOWN_LINK } from '../../lib/link-tokens';
import { assertAcceptablePassword, hashPassword } from '../../lib/passwords';
import { enqueueMail } from '../../mail/outbox';
import { appendTrail } from '../trail/trail.repository';
import { findUserByEmail, findUserById, insertUser } from '../users/users.repository';
import { getMember, insertMember, setMemberRole } from '../members/members.repository';
import { invitationMail } from './invitation-mail';
import {
  claimInvitation,
  findInvitation,
  findInvitationByHash,
  insertInvitation,
  listPendingInvitations,
  revokeInvitation,
  setInvitationAcceptedBy,
  type StoredInvitation,
} from './invitations.repository';

export const INVITATION_LIFETIME_MS = 7 * 24 * 3600 * 1000;

const refusalWords = {
  link_used: 'This invitation has already been accepted. Sign in to reach the project.',
  link_revoked: 'This invitation was withdrawn by the project’s lead astronomer. Ask them for a new one if you still mean to join.',
  link_expired: 'This invitation has expired (an invitation lasts 7 days). Ask the project’s lead astronomer to invite you again.',
} as const;

function publicView({ projectId: _p, projectName: _n, projectCode: _c, usedAt: _u, revokedAt: _r, ...rest }: StoredInvitation): Invitation {
  return rest;
}

export function createInvitationsService(db: Db, clock: Clock, options: { publicUrl: string; pepper?: string }) {
  const base = options.publicUrl.replace(/\/+$/, '');

  /** The invitation a link names, if it can still be accepted; a clear refusal otherwise. */
  async function usable(token: string, now: Date): Promise<StoredInvitation> {
    const inv = await findInvitationByHash(db, hashLinkToken(token));
    if (!inv) throw new AppError(404, 'link_unknown', UNKNOWN_LINK);
    const refusal = linkRefusal(inv, now);
    if (refusal) throw new AppError(410, refusal, refusalWords[refusal]);
    return inv;
  }

  return {
    list: (projectId: number) => listPendingInvitations(db, projectId, clock.now()).then((l) => l.map(publicView)),

    async create(projectId: number, input: CreateInvitationBody, actorUserId: number): Promise<Invitation> {
      const now = clock.now();
      const account = await findUserByEmail(db, input.email);
      if (account && (await getMember(db, projectId, account.id))) {
        throw conflict('That person is already a member of this project.', [{ path: 'email', message: 'Already a member.' }]);
      }
      if ((await listPendingInvitations(db, projectId, now, input.email)).length > 0) {
        throw conflict('An invitation to that address is still waiting. Withdraw it first to send a new one.', [{ path: 'email', message: 'Already invited.' }]);
      }
      const inviter = await findUserById(db, actorUserId);
      const { token, hash } = newLinkToken();
      const expiresAt = expiresAfter(now, INVITATION_LIFETIME_MS);
      const id = await db.transaction(async (trx) => {
        const id = await insertInvitation(trx, { projectId, email: input.email, role: input.role, tokenHash: hash, invitedBy: actorUserId, expiresAt }, now);
        const stored = (await findInvitation(trx, projectId, id))!;
        const mail = invitationMail({
          projectName: stored.projectName,
          projectCode: stored.projectCode,
          role: input.role,
          inviterName: inviter?.name ?? 'The lead astronomer',
          href: `${base}/invitation#${token}`,
          expiresAt,
        });
        await enqueueMail(trx, { purpose: 'invitation', idempotencyKey: `invitation:${id}`, to: input.email, ...mail }, now);
        await appendTrail(
          trx,
          { projectId, actorUserId, action: 'invitation.created', entityType: 'invitation', entityId: id, after: { email: input.email, role: input.role, expiresAt: expiresAt.toISOString() } },
          now,
        );
        return id;
      });
      return publicView((await findInvitation(db, projectId, id))!);
    },

    async revoke(projectId: number, invitationId: number, actorUserId: number): Promise<void> {
      const inv = await findInvitation(db, projectId, invitationId);
      if (!inv) throw notFound('No such invitation in this project.');
      await db.transaction(async (trx) => {
        const now = clock.now();
        if (!(await revokeInvitation(trx, projectId, invitationId, now))) {
          throw conflict(inv.usedAt ? 'That invitation has already been accepted.' : 'That invitation was already withdrawn.');
        }
        await appendTrail(trx, { projectId, actorUserId, action: 'invitation.revoked', entityType: 'invitation', entityId: invitationId, before: { email: inv.email, role: inv.role } }, now);
      });
    },

    async lookup(token: string): Promise<InvitationLookup> {
      const inv = await usable(token, clock.now());
      const account = await findUserByEmail(db, inv.email);
      return { projectName: inv.projectName, projectCode: inv.projectCode, email: inv.email, role: inv.role, invitedByName: inv.invitedByName, expiresAt: inv.expiresAt, accountExists: Boolean(account) };
    },

    /**
     * Accepts an invitation: for an address without an account, creates it
     * with the chosen name and password; for one with an account, the
     * signed-in owner of that account gets the role. Claiming the
     * invitation, the account, the membership and the trail are one
     * transaction.
     */
    async accept(input: AcceptInvitationBody, signedIn: User | undefined): Promise<{ projectId: number; user: User; accountCreated: boolean }> {
      const inv = await usable(input.token, clock.now());
      const account = await findUserByEmail(db, inv.email);
      let passwordHash: string | null = null;
      if (account) {
        if (!signedIn) throw new AppError(401, 'unauthenticated', `An account with ${inv.email} exists. Sign in as it to accept.`);
        if (signedIn.id !== account.id) throw forbidden(`This invitation is for ${inv.email}, and you are signed in as ${signedIn.email}. Sign out, then sign in as ${inv.email}.`);
      } else {
        const missing: FieldIssue[] = [];
        if (!input.name) missing.push({ path: 'name', message: 'Enter your name.' });
        if (!input.password) missing.push({ path: 'password', message: 'Choose a password.' });
        if (missing.length > 0) throw validationFailed(missing);
        assertAcceptablePassword(input.password!, { email: inv.email, name: input.name });
        passwordHash = await hashPassword(input.password!, options.pepper);
      }
      const now = clock.now();
      const user = await db.transaction(async (trx) => {
        if (!(await claimInvitation(trx, inv.id, now))) {
          // Someone used, withdrew or outlived the link since it was read.
          const again = (await findInvitation(trx, inv.projectId, inv.id))!;
          const refusal = linkRefusal(again, now) ?? 'link_used';
          throw new AppError(410, refusal, refusalWords[refusal]);
        }
        let user: User;
        if (account) {
          const { passwordHash: _omit, ...existing } = account;
          user = existing;
        } else {
          if (await findUserByEmail(trx, inv.email)) throw conflict('An account with this address was created meanwhile. Sign in as it, then open the link again.');
          user = await insertUser(trx, { email: inv.email, name: input.name!, passwordHash: passwordHash!, isSiteAdmin: false }, now);
          await appendTrail(trx, { projectId: null, actorUserId: user.id, action: 'user.created', entityType: 'user', entityId: user.id, after: user, note: 'Accepted an invitation.' }, now);
        }
        await setInvitationAcceptedBy(trx, inv.id, user.id);
        const member = await getMember(trx, inv.projectId, user.id);
        if (member) {
          // Already a member (added by hand meanwhile): the invitation's role is what the lead chose last.
          if (member.role !== inv.role) {
            await setMemberRole(trx, inv.projectId, user.id, inv.role);
            await appendTrail(
              trx,
              { projectId: inv.projectId, actorUserId: user.id, action: 'member.role_changed', entityType: 'member', entityId: user.id, before: { role: member.role }, after: { role: inv.role }, note: 'Accepted an invitation.' },
              now,
            );
          }
        } else {
          await insertMember(trx, { projectId: inv.projectId, userId: user.id, role: inv.role }, now);
          await appendTrail(
            trx,
            { projectId: inv.projectId, actorUserId: user.id, action: 'member.added', entityType: 'member', entityId: user.id, after: { email: user.email, role: inv.role }, note: 'Accepted an invitation.' },
            now,
          );
        }
        return user;
      });
      return { projectId: inv.projectId, user, accountCreated: !account };
    },
  };
}

export type InvitationsService = ReturnType<typeof createInvitationsService>;
