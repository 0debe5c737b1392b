import { randomBytes } from 'node:crypto';
import type { Db } from './db/knex';
import type { Clock } from './lib/clock';
import { createUsersService } from './modules/users/users.service';
import { createProjectsService } from './modules/projects/projects.service';
import { createMembersService } from './modules/members/members.service';
import { createTargetsService } from './modules/targets/targets.service';
import { createTokensService } from './modules/tokens/tokens.service';
import { createUploadsService } from './modules/uploads/uploads.service';
import { createDerivedValuesService } from './modules/derived-values/derived-values.service';
import { createMeasurementsService } from './modules/measurements/measurements.service';
import { createTrailService } from './modules/trail/trail.service';
import { createSummaryService } from './modules/summary/summary.service';
import { createMailPreferencesService } from './modules/mail-preferences/mail-preferences.service';
import { createMailFakeService } from './modules/mail-fake/mail-fake.service';
import { createInvitationsService } from './modules/invitations/invitations.service';
import { createPasswordResetsService } from './modules/password-resets/password-resets.service';
import { createSessionsService, type SessionLimits } from './modules/auth/sessions.service';
import { createSecondFactorService } from './modules/second-factor/second-factor.service';
import type { MailInbox } from './mail/fake-smtp';
import type { UploadJobs } from './modules/uploads/upload-jobs';
import { createAccountExportService } from './modules/account/account-export.service';

export interface ServiceOptions {
  /** The address people open Starledger at, for links in mail. */
  publicUrl?: string;
  /** What the local mail fake caught, when it is the one receiving mail. */
  mailInbox?: MailInbox;
  /** Where uploads are read and committed (a worker thread in the server); in the request thread when omitted. */
  uploadJobs?: UploadJobs;
  /** How long a signed-in session lasts (sessions.service.ts); 12 hours from sign-in and 30 idle minutes when omitted. */
  sessionLimits?: SessionLimits;
  /** The secret password hashes are made with (PASSWORD_PEPPER; server/lib/passwords.ts); plain scrypt when omitted. */
  passwordPepper?: string;
  /** The key one-time password secrets are encrypted with (SECOND_FACTOR_KEY; second-factor.service.ts); a random one for this process when omitted (tests). */
  secondFactorKey?: string;
  /** Megabytes of uploaded files one person may have stored over every project (UPLOAD_QUOTA_MB); no limit when omitted. */
  uploadQuotaMb?: number;
  /** How many uploaded files one person may have stored over every project (UPLOAD_QUOTA_FILES); no limit when omitted. */
  uploadQuotaFiles?: number;
}

export const DEFAULT_PUBLIC_URL = 'http://localhost:3000';

/** Services are built once per app, with the app's database and clock. */
export function createServices(db: Db, clock: Clock, options: ServiceOptions = {}) {
  const publicUrl = options.publicUrl ?? DEFAULT_PUBLIC_URL;
  const services = {
    users: createUsersService(db, clock, { publicUrl, pepper: options.passwordPepper }),
    projects: createProjectsService(db, clock),
    members: createMembersService(db, clock),
    targets: createTargetsService(db, clock),
    tokens: createTokensService(db, clock),
    uploads: createUploadsService(db, clock, { jobs: options.uploadJobs, quotaMb: options.uploadQuotaMb, quotaFiles: options.uploadQuotaFiles }),
    derivedValues: createDerivedValuesService(db, clock, { publicUrl }),
    measurements: createMeasurementsService(db),
    trail: createTrailService(db),
    summary: createSummaryService(db, clock, { publicUrl }),
    mailPreferences: createMailPreferencesService(db, clock),
    mailFake: createMailFakeService(options.mailInbox),
    invitations: createInvitationsService(db, clock, { publicUrl, pepper: options.passwordPepper }),
    passwordResets: createPasswordResetsService(db, clock, { publicUrl, pepper: options.passwordPepper }),
    sessions: createSessionsService(db, clock, options.sessionLimits),
    secondFactor: createSecondFactorService(db, clock, options.secondFactorKey ?? randomBytes(32).toString('hex')),
  };
  // Gathers a person's data from the services that keep each part.
  return { ...services, accountExport: createAccountExportService(clock, services) };
}

export type Services = ReturnType<typeof createServices>;
