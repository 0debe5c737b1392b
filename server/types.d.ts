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
  }
}

export interface ProjectAccess {
  projectId: number;
  role: ProjectRole;
}
