/** /api/team/members: who is in the current team and with which roles. */
import { and, eq } from 'drizzle-orm';
import { z } from 'zod';
import { memberships, users } from '../../drizzle/schema';
import type { ApiRoutes } from '../api-routes';
import { audit } from '../audit';
import type { AppContext } from '../context';
import type { DbOrTx } from '../db';
import { ApiError, parseBody } from '../errors';
import { uuidParam } from '../ids';
import { isRole, ROLES } from '../permissions';

export const rolesField = z
  .array(z.enum(ROLES))
  .min(1, 'must hold at least one role')
  .transform((r) => [...new Set(r)]);
const memberBody = z.object({ roles: rolesField });

function memberRow(row: { userId: string; email: string; name: string; roles: string[] }) {
  return { userId: row.userId, email: row.email, name: row.name, roles: row.roles.filter(isRole) };
}

function memberIdParam(raw: unknown): string {
  return uuidParam(raw, 'No such member in this team');
}

async function adminCount(db: DbOrTx, teamId: string, exceptUserId: string): Promise<number> {
  const rows = await db.select({ userId: memberships.userId, roles: memberships.roles }).from(memberships).where(eq(memberships.teamId, teamId));
  return rows.filter((r) => r.userId !== exceptUserId && r.roles.includes('admin')).length;
}

export function memberRoutes(api: ApiRoutes, ctx: AppContext): void {
  const { db } = ctx;

  api.get('/team/members', 'team.manage', async (req, res) => {
    const rows = await db
      .select({ userId: users.id, email: users.email, name: users.name, roles: memberships.roles })
      .from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .where(eq(memberships.teamId, req.membership!.teamId))
      .orderBy(users.name);
    res.json(rows.map(memberRow));
  });

  api.patch('/team/members/:userId', 'team.manage', async (req, res) => {
    const { roles } = parseBody(memberBody, req.body);
    const teamId = req.membership!.teamId;
    const userId = memberIdParam(req.params.userId);
    const member = await db.transaction(async (tx) => {
      const [row] = await tx
        .select({ userId: users.id, email: users.email, name: users.name, roles: memberships.roles })
        .from(memberships)
        .innerJoin(users, eq(users.id, memberships.userId))
        .where(and(eq(memberships.teamId, teamId), eq(users.id, userId)));
      if (!row) throw new ApiError('not-found', 'No such member in this team');
      if (row.roles.includes('admin') && !roles.includes('admin') && (await adminCount(tx, teamId, userId)) === 0) {
        throw new ApiError('conflict', 'A team needs at least one admin; make someone else admin first');
      }
      await tx
        .update(memberships)
        .set({ roles })
        .where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)));
      await audit(tx, { teamId, user: req.user!, action: 'member.roles', target: row.email, detail: { from: row.roles, to: roles } });
      return { ...row, roles };
    });
    res.json(memberRow(member));
  });

  api.delete('/team/members/:userId', 'team.manage', async (req, res) => {
    const teamId = req.membership!.teamId;
    const userId = memberIdParam(req.params.userId);
    await db.transaction(async (tx) => {
      const [row] = await tx
        .select({ email: users.email, roles: memberships.roles })
        .from(memberships)
        .innerJoin(users, eq(users.id, memberships.userId))
        .where(and(eq(memberships.teamId, teamId), eq(users.id, userId)));
      if (!row) throw new ApiError('not-found', 'No such member in this team');
      if (row.roles.includes('admin') && (await adminCount(tx, teamId, userId)) === 0) {
        throw new ApiError('conflict', 'A team needs at least one admin; the last admin cannot be removed');
      }
      await tx.delete(memberships).where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)));
      await audit(tx, { teamId, user: req.user!, action: 'member.remove', target: row.email });
    });
    res.status(204).end();
  });
}
