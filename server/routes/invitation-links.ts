/**
 * /api/invitations/:token: what a link offers, and accepting it. Acceptance is tied to the invited
 * address: a signed-in account with another e-mail is refused (403) unless the admin set the
 * audited `anyAccount` override when inviting; someone signed out creates the account of that address.
 */
import type { RequestHandler } from 'express';
import { and, eq, isNull } from 'drizzle-orm';
import { z } from 'zod';
import { invitations, memberships, teams, users } from '../../drizzle/schema';
import type { ApiRoutes } from '../api-routes';
import { audit } from '../audit';
import { hashToken } from '../auth/invitation-token';
import { loadMe } from '../auth/me';
import { normaliseEmail } from '../auth/passport';
import { hashPassword } from '../auth/passwords';
import type { AppContext } from '../context';
import type { DbOrTx } from '../db';
import { ApiError, parseBody } from '../errors';
import { isRole, type Role } from '../permissions';
import { nameField, passwordField, signIn } from './auth';

const acceptBody = z.object({ name: nameField.optional(), password: passwordField.optional() });
const tokenField = z.string().max(200, 'is not an invitation token');

type InvitationRow = typeof invitations.$inferSelect;

/** The refusal shown when the signed-in account is not the invited one. */
export function wrongAccountMessage(invited: string, signedInAs: string): string {
  return (
    `This invitation is for ${invited}, but you are signed in as ${signedInAs}. ` +
    `Sign out and open the link again to join as ${invited}, or ask the team's admin to invite ${signedInAs}.`
  );
}

function mayAccept(invitation: InvitationRow, user: { email: string }): boolean {
  return invitation.anyAccount || normaliseEmail(user.email) === invitation.email;
}

export function invitationLinkRoutes(api: ApiRoutes, ctx: AppContext): void {
  const { db } = ctx;

  api.get('/invitations/:token', 'public', async (req, res) => {
    const found = await findInvitation(db, req.params.token);
    const inv = found.invitation;
    res.json({
      teamName: found.teamName,
      email: inv.email,
      roles: inv.roles,
      anyAccount: inv.anyAccount,
      expired: inv.expiresAt.getTime() < Date.now(),
      accepted: inv.acceptedAt !== null,
      revoked: inv.revokedAt !== null,
      // Whether the caller's account may accept, so the page can refuse before anyone clicks.
      ...(req.user ? { signedInAs: req.user.email, mayAccept: mayAccept(inv, req.user) } : {}),
    });
  });

  // Only a new account's password is hashed, so only signed-out accepts spend the password budget.
  const budgetWhenSignedOut: RequestHandler = (req, res, next) => (req.user ? next() : ctx.passwordBudget(req, res, next));

  api.post('/invitations/:token/accept', 'public', budgetWhenSignedOut, async (req, res) => {
    const body = parseBody(acceptBody, req.body);
    const tokenHash = hashToken(parseBody(tokenField, req.params.token, 'Invalid invitation link'));
    const signedIn = req.user;
    let newUser: { id: string; email: string; name: string } | undefined;
    if (!signedIn) {
      const fields = [
        ...(body.name ? [] : [{ path: 'name', message: 'is required for a new account' }]),
        ...(body.password ? [] : [{ path: 'password', message: 'is required for a new account' }]),
      ];
      if (fields.length) throw new ApiError('validation', 'Sign in, or give a name and password to create your account', { fields });
    }
    const passwordHash = signedIn ? '' : await hashPassword(body.password!, ctx.bcryptCost, ctx.passwords);
    const teamId = await db.transaction(async (tx) => {
      // Only an open invitation is taken; a concurrent accept finds nothing here.
      const [invitation] = await tx
        .update(invitations)
        .set({ acceptedAt: new Date() })
        .where(and(eq(invitations.tokenHash, tokenHash), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
        .returning();
      if (!invitation) {
        const [used] = await tx.select({ revokedAt: invitations.revokedAt }).from(invitations).where(eq(invitations.tokenHash, tokenHash));
        if (!used) throw new ApiError('not-found', 'No such invitation');
        throw new ApiError('conflict', used.revokedAt ? "This invitation was withdrawn by the team's admin" : 'This invitation has already been accepted');
      }
      if (invitation.expiresAt.getTime() < Date.now()) throw new ApiError('conflict', 'This invitation has expired; ask your team admin for a new one');
      // Throwing here rolls the claim back: the invited person can still use the link.
      if (signedIn && !mayAccept(invitation, signedIn)) throw new ApiError('forbidden', wrongAccountMessage(invitation.email, signedIn.email));
      let user = signedIn;
      if (!user) {
        const [existing] = await tx.select({ id: users.id }).from(users).where(eq(users.email, invitation.email));
        if (existing) throw new ApiError('conflict', `An account for ${invitation.email} exists; sign in first, then accept`);
        [user] = await tx
          .insert(users)
          .values({ email: invitation.email, name: body.name!, passwordHash })
          .returning({ id: users.id, email: users.email, name: users.name });
        newUser = user;
      }
      const [member] = await tx
        .select({ roles: memberships.roles })
        .from(memberships)
        .where(and(eq(memberships.teamId, invitation.teamId), eq(memberships.userId, user.id)));
      if (member) {
        const roles: Role[] = [...new Set([...member.roles.filter(isRole), ...invitation.roles.filter(isRole)])];
        await tx
          .update(memberships)
          .set({ roles })
          .where(and(eq(memberships.teamId, invitation.teamId), eq(memberships.userId, user.id)));
      } else {
        await tx.insert(memberships).values({ teamId: invitation.teamId, userId: user.id, roles: invitation.roles });
      }
      await tx.update(invitations).set({ acceptedBy: user.id }).where(eq(invitations.id, invitation.id));
      const other = normaliseEmail(user.email) !== invitation.email;
      await audit(tx, {
        teamId: invitation.teamId,
        user,
        action: 'invitation.accept',
        target: invitation.email,
        detail: { roles: invitation.roles, ...(other ? { acceptedAs: user.email, override: 'any signed-in account (set by admin)' } : {}) },
      });
      return invitation.teamId;
    });
    if (newUser) await signIn(req, newUser, teamId);
    else req.session.teamId = teamId;
    res.json(await loadMe(db, newUser ?? signedIn!, teamId));
  });
}

async function findInvitation(db: DbOrTx, token: unknown) {
  const [row] = await db
    .select({ invitation: invitations, teamName: teams.name })
    .from(invitations)
    .innerJoin(teams, eq(teams.id, invitations.teamId))
    .where(eq(invitations.tokenHash, hashToken(String(token))));
  if (!row) throw new ApiError('not-found', 'No such invitation');
  return row;
}
