/**
 * /api/team/invitations: an admin invites an address with roles, lists open invitations, revokes
 * one, or resends it with a fresh link (the old link stops working). Accepting is invitation-links.ts.
 */
import { and, desc, eq, gt, isNull } from 'drizzle-orm';
import { z } from 'zod';
import { invitations, memberships, users } from '../../drizzle/schema';
import type { ApiRoutes } from '../api-routes';
import { audit } from '../audit';
import { newInvitationToken } from '../auth/invitation-token';
import { normaliseEmail } from '../auth/passport';
import type { AppContext } from '../context';
import { ApiError, parseBody } from '../errors';
import { uuidParam } from '../ids';
import { emailField } from './auth';
import { rolesField } from './team-members';

export const INVITATION_DAYS = 14;
const invitationBody = z.strictObject({
  email: emailField,
  roles: rolesField,
  /** Admin override: any signed-in account may accept, not only one with this address (audited). */
  anyAccount: z.boolean().optional(),
});

type InvitationRow = typeof invitations.$inferSelect;

export function invitationJson(row: InvitationRow) {
  return {
    id: row.id,
    email: row.email,
    roles: row.roles,
    anyAccount: row.anyAccount,
    createdAt: row.createdAt,
    acceptedAt: row.acceptedAt,
    expiresAt: row.expiresAt,
  };
}

function expiry(): Date {
  return new Date(Date.now() + INVITATION_DAYS * 86400_000);
}

export function invitationRoutes(api: ApiRoutes, ctx: AppContext): void {
  const { db } = ctx;

  async function mailInvitation(row: InvitationRow, token: string, teamName: string, inviter: string): Promise<void> {
    const link = `${ctx.config.publicUrl}/join/${token}`;
    await ctx.mailer.send({
      to: row.email,
      teamId: row.teamId,
      subject: `You are invited to ${teamName} on Runnel`,
      text: [
        `${inviter} invited you to join the team "${teamName}" on Runnel as ${row.roles.join(', ')}.`,
        '',
        `Open this link to accept (valid for ${INVITATION_DAYS} days):`,
        link,
        '',
        row.anyAccount
          ? 'You may accept with any Runnel account.'
          : `Accept while signed in as ${row.email}, or create an account for ${row.email} from the link.`,
        'If you were not expecting this, ignore this message.',
      ].join('\n'),
    });
  }

  api.get('/team/invitations', 'team.manage', async (req, res) => {
    const rows = await db
      .select()
      .from(invitations)
      .where(and(eq(invitations.teamId, req.membership!.teamId), isNull(invitations.revokedAt)))
      .orderBy(desc(invitations.createdAt));
    res.json(rows.map(invitationJson));
  });

  api.post('/team/invitations', 'team.manage', async (req, res) => {
    const body = parseBody(invitationBody, req.body);
    const { teamId, teamName } = req.membership!;
    const email = normaliseEmail(body.email);
    const anyAccount = body.anyAccount ?? false;
    const { token, tokenHash } = newInvitationToken();
    const invitation = await db.transaction(async (tx) => {
      const [member] = await tx
        .select({ roles: memberships.roles })
        .from(memberships)
        .innerJoin(users, eq(users.id, memberships.userId))
        .where(and(eq(memberships.teamId, teamId), eq(users.email, email)));
      if (member) {
        throw new ApiError('conflict', `${email} is already a member of this team (${member.roles.join(', ')}); change their roles under Members`, {
          fields: [{ path: 'email', message: 'is already a member of this team' }],
        });
      }
      const [open] = await tx
        .select({ createdAt: invitations.createdAt })
        .from(invitations)
        .where(
          and(
            eq(invitations.teamId, teamId),
            eq(invitations.email, email),
            isNull(invitations.acceptedAt),
            isNull(invitations.revokedAt),
            gt(invitations.expiresAt, new Date()),
          ),
        );
      if (open) {
        throw new ApiError('conflict', `${email} already has an open invitation; resend or revoke it under Pending invitations`, {
          fields: [{ path: 'email', message: 'already has an open invitation' }],
        });
      }
      const [row] = await tx
        .insert(invitations)
        .values({
          teamId,
          email,
          roles: body.roles,
          tokenHash,
          invitedBy: req.user!.id,
          anyAccount,
          expiresAt: expiry(),
        })
        .returning();
      await audit(tx, {
        teamId,
        user: req.user!,
        action: 'invitation.create',
        target: email,
        detail: { roles: body.roles, ...(anyAccount ? { anyAccount: 'any signed-in account may accept' } : {}) },
      });
      return row;
    });
    await mailInvitation(invitation, token, teamName, req.user!.name);
    res.status(201).json(invitationJson(invitation));
  });

  /** The team's open invitation `:invitationId` (not accepted, not revoked), or 404 / 409. */
  async function openInvitation(teamId: string, raw: unknown): Promise<InvitationRow> {
    const id = uuidParam(raw, 'No such invitation');
    const [row] = await db
      .select()
      .from(invitations)
      .where(and(eq(invitations.id, id), eq(invitations.teamId, teamId), isNull(invitations.revokedAt)));
    if (!row) throw new ApiError('not-found', 'No such invitation');
    if (row.acceptedAt) throw new ApiError('conflict', `${row.email} has already accepted this invitation`);
    return row;
  }

  api.delete('/team/invitations/:invitationId', 'team.manage', async (req, res) => {
    const { teamId } = req.membership!;
    const row = await openInvitation(teamId, req.params.invitationId);
    await db.transaction(async (tx) => {
      const [revoked] = await tx
        .update(invitations)
        .set({ revokedAt: new Date() })
        .where(and(eq(invitations.id, row.id), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
        .returning();
      if (!revoked) throw new ApiError('conflict', 'This invitation has just been accepted or revoked');
      await audit(tx, { teamId, user: req.user!, action: 'invitation.revoke', target: row.email, detail: { roles: row.roles } });
    });
    res.status(204).end();
  });

  api.post('/team/invitations/:invitationId/resend', 'team.manage', async (req, res) => {
    const { teamId, teamName } = req.membership!;
    const row = await openInvitation(teamId, req.params.invitationId);
    const { token, tokenHash } = newInvitationToken();
    const updated = await db.transaction(async (tx) => {
      // A new token: the link in the earlier mail stops working, the new one runs a full term.
      const [renewed] = await tx
        .update(invitations)
        .set({ tokenHash, expiresAt: expiry() })
        .where(and(eq(invitations.id, row.id), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
        .returning();
      if (!renewed) throw new ApiError('conflict', 'This invitation has just been accepted or revoked');
      await audit(tx, { teamId, user: req.user!, action: 'invitation.resend', target: row.email, detail: { roles: row.roles } });
      return renewed;
    });
    await mailInvitation(updated, token, teamName, req.user!.name);
    res.json(invitationJson(updated));
  });
}
