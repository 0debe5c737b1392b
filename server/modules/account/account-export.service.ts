import type { User } from '../../../shared/schemas/auth';
import type { AccountExport } from '../../../shared/schemas/account-export';
import type { Clock } from '../../lib/clock';
import type { ProjectsService } from '../projects/projects.service';
import type { TokensService } from '../tokens/tokens.service';
import type { SessionsService } from '../auth/sessions.service';
import type { MailPreferencesService } from '../mail-preferences/mail-preferences.service';
import type { TrailService } from '../trail/trail.service';

interface Sources {
  projects: ProjectsService;
  tokens: TokensService;
  sessions: SessionsService;
  mailPreferences: MailPreferencesService;
  trail: TrailService;
}

/**
 * The export of a person's own data (ASVS 8.3.2), gathered from the services
 * that keep each part, so each part reads as its own page shows it. Only
 * what the person may see of themselves, and no credential.
 */
export function createAccountExportService(clock: Clock, from: Sources) {
  return {
    async of(user: User, currentSid: string | undefined): Promise<AccountExport> {
      const [projects, sessions, mailPreferences, tokens, trail] = await Promise.all([
        from.projects.listMine(user.id),
        from.sessions.list(user.id, currentSid ?? ''),
        from.mailPreferences.listMine(user.id),
        from.tokens.list(user.id),
        from.trail.ofPerson(user.id),
      ]);
      return {
        format: 'starledger-account-export',
        version: 1,
        exportedAt: clock.now().toISOString(),
        account: { id: user.id, email: user.email, name: user.name, isSiteAdmin: user.isSiteAdmin, secondFactor: user.secondFactor },
        memberships: projects.filter((p) => p.myRole !== null).map((p) => ({ projectId: p.id, projectCode: p.code, projectName: p.name, role: p.myRole! })),
        // A session's listed id is left out: it names a live session, and the file may travel.
        sessions: sessions.map(({ signedInAt, lastSeenAt, browser, userAgent, address, current }) => ({ signedInAt, lastSeenAt, browser, userAgent, address, current })),
        mailPreferences,
        tokens: tokens.map(({ name, createdAt, lastUsedAt, expiresAt, revokedAt }) => ({ name, createdAt, lastUsedAt, expiresAt, revokedAt })),
        trail,
      };
    },
  };
}

export type AccountExportService = ReturnType<typeof createAccountExportService>;
