/** Shapes of the API's responses (see server/API.md). */
import type { Role } from '../../../../shared/accounts';
import type { UnitSystem } from '../../../../engine/units';

// Kept once: roles and the password rule in shared/accounts.ts, unit systems in engine/units.ts.
export { MIN_PASSWORD_LENGTH, ROLES, type Role } from '../../../../shared/accounts';
export type { UnitSystem };

export interface TeamRef {
  id: string;
  name: string;
  roles: Role[];
}

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

export interface Team {
  id: string;
  name: string;
}

export interface Member {
  userId: string;
  email: string;
  name: string;
  roles: Role[];
}

export interface Invitation {
  id: string;
  email: string;
  roles: Role[];
  /** Admin override: any signed-in account may accept, not only one with `email`. */
  anyAccount: boolean;
  createdAt: string;
  acceptedAt: string | null;
  expiresAt: string;
}

/** What anyone holding an invitation link may see (GET /api/invitations/:token). */
export interface InvitationPreview {
  teamName: string;
  email: string;
  roles: Role[];
  anyAccount: boolean;
  expired: boolean;
  accepted: boolean;
  revoked: boolean;
  /** Present when signed in: the account's e-mail and whether it may accept (the invited address, or anyAccount). */
  signedInAs?: string;
  mayAccept?: boolean;
}

export interface OutboxMail {
  id: string;
  to: string;
  subject: string;
  text: string;
  sentAt: string;
}

/** `detail` is free-form: the server records a small object (e.g. `{ roles: [...] }`) or a sentence. */
export interface AuditEntry {
  id: string | number;
  at: string;
  /** A name (the user's, or Runnel for the demo set-up), never an id. */
  who: string;
  userEmail: string | null;
  action: string;
  target: string;
  detail: string | Record<string, unknown> | null;
}

export interface SignUpRequest {
  email: string;
  name: string;
  teamName: string;
}
/** POST /api/auth/signup answers this whether or not the address is registered. */
export interface SignUpAnswer {
  status: 'check-email';
  message: string;
}

export interface ProjectCreate {
  name: string;
  siteName?: string;
  notes?: string;
  units?: UnitSystem;
}

export type ProjectPatch = Partial<Pick<Project, 'name' | 'siteName' | 'notes' | 'units' | 'archived'>>;

/** Label shown for each unit system. */
export const UNIT_SYSTEM_LABELS: Record<UnitSystem, string> = { us: 'US customary', si: 'SI (metric)' };
