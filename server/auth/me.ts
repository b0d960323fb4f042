/** The `Me` response (server/API.md "Auth") and the memberships behind it. */
import { asc, eq } from 'drizzle-orm';
import { memberships, teams } from '../../drizzle/schema';
import type { DbOrTx } from '../db';
import { isRole, permissionsFor, type Permission, type Role } from '../permissions';
import type { SessionUser } from '../types';

export interface TeamRef {
  id: string;
  name: string;
  roles: Role[];
}
export interface Me {
  user: SessionUser;
  teams: TeamRef[];
  currentTeamId: string | null;
  roles: Role[];
  permissions: Permission[];
}

/** The user's teams, oldest membership first. */
export async function teamsOf(db: DbOrTx, userId: string): Promise<TeamRef[]> {
  const rows = await db
    .select({ id: teams.id, name: teams.name, roles: memberships.roles })
    .from(memberships)
    .innerJoin(teams, eq(teams.id, memberships.teamId))
    .where(eq(memberships.userId, userId))
    .orderBy(asc(memberships.createdAt), asc(teams.name));
  return rows.map((r) => ({ id: r.id, name: r.name, roles: r.roles.filter(isRole) }));
}

/** The current team: the session's choice if still a member, else the first team. */
export function pickCurrentTeam(list: TeamRef[], sessionTeamId: string | undefined): TeamRef | null {
  return list.find((t) => t.id === sessionTeamId) ?? list[0] ?? null;
}

export function buildMe(user: SessionUser, list: TeamRef[], current: TeamRef | null): Me {
  const roles = current?.roles ?? [];
  return {
    user: { id: user.id, email: user.email, name: user.name },
    teams: list,
    currentTeamId: current?.id ?? null,
    roles,
    permissions: permissionsFor(roles),
  };
}

export async function loadMe(db: DbOrTx, user: SessionUser, sessionTeamId: string | undefined): Promise<Me> {
  const list = await teamsOf(db, user.id);
  return buildMe(user, list, pickCurrentTeam(list, sessionTeamId));
}
