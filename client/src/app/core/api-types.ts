/** Shapes of the API's responses (see server/API.md). */
export type Role = 'admin' | 'designer' | 'reviewer' | 'estimator' | 'owner';
export type UnitSystem = 'us' | 'si';

export interface TeamRef { id: string; name: string; roles: Role[] }

export interface Me {
  user: { id: string; email: string; name: string };
  teams: TeamRef[];
  currentTeamId: string | null;
  roles: Role[];
  permissions: string[];
}

export interface Project {
  id: string;
  teamId: string;
  name: string;
  siteName: string;
  notes: string;
  units: UnitSystem;
  archived: boolean;
  createdAt: string;
  updatedAt: string;
}

export interface ApiErrorBody {
  error: { code: string; message: string; fields?: { path: string; message: string }[]; line?: number };
}
