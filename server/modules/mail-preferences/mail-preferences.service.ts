import type { Db } from '../../db/knex';
import type { Clock } from '../../lib/clock';
import type { MailPreference, UpdateMailPreferenceBody } from '../../../shared/schemas/mail';
import { listPreferences, savePreference } from './mail-preferences.repository';

export function createMailPreferencesService(db: Db, clock: Clock) {
  return {
    listMine: (userId: number): Promise<MailPreference[]> => listPreferences(db, userId),
    /** Saves one project's choices for the caller (a member, as the route's gate has checked) and answers the project's row. */
    async update(userId: number, projectId: number, body: UpdateMailPreferenceBody): Promise<MailPreference> {
      await savePreference(db, userId, projectId, body, clock.now());
      return (await listPreferences(db, userId)).find((p) => p.projectId === projectId)!;
    },
  };
}

export type MailPreferencesService = ReturnType<typeof createMailPreferencesService>;
