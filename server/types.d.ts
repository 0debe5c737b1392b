import type { User as StarledgerUser } from '../shared/schemas/auth';
import type { ProjectRole } from '../shared/schemas/roles';

declare global {
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends StarledgerUser {}
  }
}

declare module 'express-session' {
  interface SessionData {
    csrfToken?: string;
    /** When this session's sign-in passed the second factor (server/modules/second-factor); site-admin routes ask for it. */
    secondFactorAt?: string;
    /** A correct password whose account still owes its one-time code: not signed in yet. */
    secondFactorPending?: { userId: number; email: string; at: string };
  }
}

export interface ProjectAccess {
  projectId: number;
  role: ProjectRole;
}
