import type { Db } from '../../db/knex';
import type { Clock } from '../../lib/clock';
import type { AddMemberBody, Member } from '../../../shared/schemas/projects';
import type { ProjectRole } from '../../../shared/schemas/roles';
import { AppError, conflict, notFound, validationFailed } from '../../lib/errors';
import { appendTrail } from '../trail/trail.repository';
import { findUserByEmail } from '../users/users.repository';
import { countLeads, deleteMember, getMember, insertMember, listMembers, setMemberRole } from './members.repository';

const lastLead = () => new AppError(409, 'conflict', 'A project needs at least one lead astronomer. Make someone else lead first.');

export function createMembersService(db: Db, clock: Clock) {
  async function existing(projectId: number, userId: number): Promise<Member> {
    const member = await getMember(db, projectId, userId);
    if (!member) throw notFound('That person is not a member of this project.');
    return member;
  }

  return {
    list: (projectId: number) => listMembers(db, projectId),

    async add(projectId: number, input: AddMemberBody, actorUserId: number): Promise<Member> {
      const user = await findUserByEmail(db, input.email);
      if (!user) throw validationFailed([{ path: 'email', message: 'No account has that e-mail.' }]);
      if (await getMember(db, projectId, user.id)) {
        throw conflict('That person is already a member.', [{ path: 'email', message: 'Already a member.' }]);
      }
      await db.transaction(async (trx) => {
        const now = clock.now();
        await insertMember(trx, { projectId, userId: user.id, role: input.role }, now);
        await appendTrail(
          trx,
          { projectId, actorUserId, action: 'member.added', entityType: 'member', entityId: user.id, after: { email: user.email, role: input.role } },
          now,
        );
      });
      return existing(projectId, user.id);
    },

    async changeRole(projectId: number, userId: number, role: ProjectRole, actorUserId: number): Promise<Member> {
      const before = await existing(projectId, userId);
      await db.transaction(async (trx) => {
        if (before.role === 'lead' && role !== 'lead' && (await countLeads(trx, projectId)) <= 1) throw lastLead();
        const now = clock.now();
        await setMemberRole(trx, projectId, userId, role);
        await appendTrail(
          trx,
          { projectId, actorUserId, action: 'member.role_changed', entityType: 'member', entityId: userId, before: { role: before.role }, after: { role } },
          now,
        );
      });
      return existing(projectId, userId);
    },

    async remove(projectId: number, userId: number, actorUserId: number): Promise<void> {
      const before = await existing(projectId, userId);
      await db.transaction(async (trx) => {
        if (before.role === 'lead' && (await countLeads(trx, projectId)) <= 1) throw lastLead();
        await deleteMember(trx, projectId, userId);
        await appendTrail(
          trx,
          { projectId, actorUserId, action: 'member.removed', entityType: 'member', entityId: userId, before: { email: before.email, role: before.role } },
          clock.now(),
        );
      });
    },
  };
}

export type MembersService = ReturnType<typeof createMembersService>;
