/** Type augmentations for Express, passport and express-session. */
import type { Role } from './permissions';
import type { ProjectRow } from './project-scope';

export interface SessionUser {
  id: string;
  email: string;
  name: string;
}
export interface CurrentMembership {
  teamId: string;
  teamName: string;
  roles: Role[];
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // Passport's req.user (an empty interface is how a global type is extended)
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends SessionUser {}
    interface Request {
      /** Membership of the session's current team (currentMember in server/auth/passport.ts). */
      membership?: CurrentMembership;
      /** The project of a /projects/:id… route, of the caller's team (server/project-scope.ts). */
      project?: ProjectRow;
    }
  }
}

declare module 'express-session' {
  interface SessionData {
    /** Current team of the signed-in user. */
    teamId?: string;
    /** When the cookie's expiry was last moved (server/auth/rolling-cookie.ts). */
    renewedAt?: number;
  }
}
