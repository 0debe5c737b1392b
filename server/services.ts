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

/** Services are built once per app, with the app's database and clock. */
export function createServices(db: Db, clock: Clock) {
  return {
    users: createUsersService(db, clock),
    projects: createProjectsService(db, clock),
    members: createMembersService(db, clock),
    targets: createTargetsService(db, clock),
    tokens: createTokensService(db, clock),
    uploads: createUploadsService(db, clock),
    derivedValues: createDerivedValuesService(db, clock),
    measurements: createMeasurementsService(db),
    trail: createTrailService(db),
  };
}

export type Services = ReturnType<typeof createServices>;
