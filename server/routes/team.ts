/** /api/team/*: the current team, its members, invitations, outbox and audit log; /api/invitations/:token. */
import { createHash, randomBytes } from 'node:crypto';
import { and, desc, eq, isNull } from 'drizzle-orm';
import { z } from 'zod';
import { auditLog, invitations, memberships, outbox, teams, users } from '../../drizzle/schema';
import type { ApiRoutes } from '../api-routes';
import { audit } from '../audit';
import { loadMe } from '../auth/me';
import { normaliseEmail } from '../auth/passport';
import { hashPassword } from '../auth/passwords';
import type { AppContext } from '../context';
import type { DbOrTx } from '../db';
import { ApiError, parseBody } from '../errors';
import { isRole, ROLES, type Role } from '../permissions';
import { emailField, nameField, passwordField, signIn } from './auth';
import { uuidParam } from '../ids';

const INVITATION_DAYS = 14;
const rolesField = z.array(z.enum(ROLES)).min(1, 'must hold at least one role').transform((r) => [...new Set(r)]);
const memberBody = z.object({ roles: rolesField });
const invitationBody = z.object({ email: emailField, roles: rolesField });
const acceptBody = z.object({ name: nameField.optional(), password: passwordField.optional() });

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

function memberRow(row: { userId: string; email: string; name: string; roles: string[] }) {
  return { userId: row.userId, email: row.email, name: row.name, roles: row.roles.filter(isRole) };
}

/** The `:userId` of a member route; a value that is not a user id names no member (404, not a database error). */
function memberIdParam(raw: unknown): string {
  return uuidParam(raw, 'No such member in this team');
}

async function adminCount(db: DbOrTx, teamId: string, exceptUserId: string): Promise<number> {
  const rows = await db.select({ userId: memberships.userId, roles: memberships.roles })
    .from(memberships).where(eq(memberships.teamId, teamId));
  return rows.filter((r) => r.userId !== exceptUserId && r.roles.includes('admin')).length;
}

export function teamRoutes(api: ApiRoutes, ctx: AppContext): void {
  const { db } = ctx;

  api.get('/team', 'team.read', (req, res) => {
    res.json({ id: req.membership!.teamId, name: req.membership!.teamName });
  });

  api.get('/team/members', 'team.manage', async (req, res) => {
    const rows = await db.select({ userId: users.id, email: users.email, name: users.name, roles: memberships.roles })
      .from(memberships).innerJoin(users, eq(users.id, memberships.userId))
      .where(eq(memberships.teamId, req.membership!.teamId)).orderBy(users.name);
    res.json(rows.map(memberRow));
  });

  api.patch('/team/members/:userId', 'team.manage', async (req, res) => {
    const { roles } = parseBody(memberBody, req.body);
    const teamId = req.membership!.teamId;
    const userId = memberIdParam(req.params.userId);
    const member = await db.transaction(async (tx) => {
      const [row] = await tx.select({ userId: users.id, email: users.email, name: users.name, roles: memberships.roles })
        .from(memberships).innerJoin(users, eq(users.id, memberships.userId))
        .where(and(eq(memberships.teamId, teamId), eq(users.id, userId)));
      if (!row) throw new ApiError('not-found', 'No such member in this team');
      if (row.roles.includes('admin') && !roles.includes('admin') && (await adminCount(tx, teamId, userId)) === 0) {
        throw new ApiError('conflict', 'A team needs at least one admin; make someone else admin first');
      }
      await tx.update(memberships).set({ roles }).where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)));
      await audit(tx, { teamId, user: req.user!, action: 'member.roles', target: row.email, detail: { from: row.roles, to: roles } });
      return { ...row, roles };
    });
    res.json(memberRow(member));
  });

  api.delete('/team/members/:userId', 'team.manage', async (req, res) => {
    const teamId = req.membership!.teamId;
    const userId = memberIdParam(req.params.userId);
    await db.transaction(async (tx) => {
      const [row] = await tx.select({ email: users.email, roles: memberships.roles })
        .from(memberships).innerJoin(users, eq(users.id, memberships.userId))
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

  api.get('/team/invitations', 'team.manage', async (req, res) => {
    const rows = await db.select().from(invitations)
      .where(eq(invitations.teamId, req.membership!.teamId)).orderBy(desc(invitations.createdAt));
    res.json(rows.map(invitationJson));
  });

  api.post('/team/invitations', 'team.manage', async (req, res) => {
    const body = parseBody(invitationBody, req.body);
    const { teamId, teamName } = req.membership!;
    const email = normaliseEmail(body.email);
    const token = randomBytes(32).toString('base64url');
    const invitation = await db.transaction(async (tx) => {
      const [row] = await tx.insert(invitations).values({
        teamId, email, roles: body.roles, tokenHash: hashToken(token), invitedBy: req.user!.id,
        expiresAt: new Date(Date.now() + INVITATION_DAYS * 86400_000),
      }).returning();
      await audit(tx, { teamId, user: req.user!, action: 'invitation.create', target: email, detail: { roles: body.roles } });
      return row;
    });
    const link = `${ctx.config.publicUrl}/join/${token}`;
    await ctx.mailer.send({
      to: email,
      teamId,
      subject: `You are invited to ${teamName} on Runnel`,
      text: [
        `${req.user!.name} invited you to join the team "${teamName}" on Runnel as ${body.roles.join(', ')}.`,
        '',
        `Open this link to accept (valid for ${INVITATION_DAYS} days):`,
        link,
        '',
        'If you were not expecting this, ignore this message.',
      ].join('\n'),
    });
    res.status(201).json(invitationJson(invitation));
  });

  api.get('/invitations/:token', 'public', async (req, res) => {
    const found = await findInvitation(db, String(req.params.token));
    res.json({
      teamName: found.teamName, email: found.invitation.email, roles: found.invitation.roles,
      expired: found.invitation.expiresAt.getTime() < Date.now(), accepted: found.invitation.acceptedAt !== null,
    });
  });

  api.post('/invitations/:token/accept', 'public', async (req, res) => {
    const body = parseBody(acceptBody, req.body);
    const tokenHash = hashToken(String(req.params.token));
    const signedIn = req.user;
    let newUser: { id: string; email: string; name: string } | undefined;
    if (!signedIn) {
      const fields = [
        ...(body.name ? [] : [{ path: 'name', message: 'is required for a new account' }]),
        ...(body.password ? [] : [{ path: 'password', message: 'is required for a new account' }]),
      ];
      if (fields.length) throw new ApiError('validation', 'Sign in, or give a name and password to create your account', { fields });
    }
    const passwordHash = signedIn ? '' : await hashPassword(body.password!, ctx.bcryptCost);
    const teamId = await db.transaction(async (tx) => {
      // Only an open invitation is taken; a concurrent accept finds nothing here.
      const [invitation] = await tx.update(invitations).set({ acceptedAt: new Date() })
        .where(and(eq(invitations.tokenHash, tokenHash), isNull(invitations.acceptedAt))).returning();
      if (!invitation) {
        const [used] = await tx.select({ id: invitations.id }).from(invitations).where(eq(invitations.tokenHash, tokenHash));
        throw used ? new ApiError('conflict', 'This invitation has already been accepted') : new ApiError('not-found', 'No such invitation');
      }
      if (invitation.expiresAt.getTime() < Date.now()) throw new ApiError('conflict', 'This invitation has expired; ask your team admin for a new one');
      let user = signedIn;
      if (!user) {
        const [existing] = await tx.select({ id: users.id }).from(users).where(eq(users.email, invitation.email));
        if (existing) throw new ApiError('conflict', `An account for ${invitation.email} exists; sign in first, then accept`);
        [user] = await tx.insert(users).values({ email: invitation.email, name: body.name!, passwordHash })
          .returning({ id: users.id, email: users.email, name: users.name });
        newUser = user;
      }
      const [member] = await tx.select({ roles: memberships.roles }).from(memberships)
        .where(and(eq(memberships.teamId, invitation.teamId), eq(memberships.userId, user.id)));
      if (member) {
        const roles: Role[] = [...new Set([...member.roles.filter(isRole), ...invitation.roles.filter(isRole)])];
        await tx.update(memberships).set({ roles })
          .where(and(eq(memberships.teamId, invitation.teamId), eq(memberships.userId, user.id)));
      } else {
        await tx.insert(memberships).values({ teamId: invitation.teamId, userId: user.id, roles: invitation.roles });
      }
      await tx.update(invitations).set({ acceptedBy: user.id }).where(eq(invitations.id, invitation.id));
      await audit(tx, { teamId: invitation.teamId, user, action: 'invitation.accept', target: invitation.email, detail: { roles: invitation.roles } });
      return invitation.teamId;
    });
    if (newUser) await signIn(req, newUser, teamId);
    else req.session.teamId = teamId;
    res.json(await loadMe(db, newUser ?? signedIn!, teamId));
  });

  api.get('/team/outbox', 'outbox.read', async (req, res) => {
    const rows = await db.select({ id: outbox.id, to: outbox.to, subject: outbox.subject, text: outbox.text, sentAt: outbox.sentAt })
      .from(outbox).where(eq(outbox.teamId, req.membership!.teamId)).orderBy(desc(outbox.id)).limit(200);
    res.json(rows.map((m) => ({ ...m, id: String(m.id) })));
  });

  api.get('/team/audit', 'audit.read', async (req, res) => {
    const rows = await db.select({
      id: auditLog.id, at: auditLog.at, userEmail: auditLog.userEmail, action: auditLog.action,
      target: auditLog.target, detail: auditLog.detail,
    }).from(auditLog).where(eq(auditLog.teamId, req.membership!.teamId)).orderBy(desc(auditLog.id)).limit(200);
    res.json(rows.map((e) => ({ ...e, id: String(e.id), detail: describeDetail(e.detail) })));
  });
}

/** An audit detail object as one readable line: `roles: estimator, owner; version: 3`. */
export function describeDetail(detail: unknown): string {
  if (!detail || typeof detail !== 'object') return '';
  return Object.entries(detail).map(([k, v]) => `${k}: ${Array.isArray(v) ? v.join(', ') : String(v)}`).join('; ');
}

function invitationJson(row: typeof invitations.$inferSelect) {
  return {
    id: row.id, email: row.email, roles: row.roles, createdAt: row.createdAt,
    acceptedAt: row.acceptedAt, expiresAt: row.expiresAt,
  };
}

async function findInvitation(db: DbOrTx, token: string) {
  const [row] = await db.select({ invitation: invitations, teamName: teams.name })
    .from(invitations).innerJoin(teams, eq(teams.id, invitations.teamId))
    .where(eq(invitations.tokenHash, hashToken(token)));
  if (!row) throw new ApiError('not-found', 'No such invitation');
  return row;
}
