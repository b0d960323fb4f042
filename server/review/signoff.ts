/**
 * Sign-off of a network version: draft → submitted → approved (frozen for good) or returned (the
 * designer fixes and submits again, usually a newer version). Each transition is one conditional
 * UPDATE (so two reviewers racing cannot both decide), audited in the same transaction, and mailed
 * afterwards to the people concerned with a link straight to the version.
 */
import { and, arrayOverlaps, desc, eq, inArray, sql } from 'drizzle-orm';
import { memberships, networkVersions, reviewComments, users } from '../../drizzle/schema';
import { audit } from '../audit';
import type { AppContext } from '../context';
import type { Db } from '../db';
import { ApiError } from '../errors';
import { loadVersion, type VersionStatus } from '../network/versions-store';
import type { Role } from '../permissions';
import type { ProjectRow } from '../project-scope';

export type Transition = 'submit' | 'approve' | 'return';

const RULES: Record<Transition, { from: VersionStatus[]; to: VersionStatus; verb: string }> = {
  submit: { from: ['draft', 'returned'], to: 'submitted', verb: 'submitted for review' },
  approve: { from: ['submitted'], to: 'approved', verb: 'approved' },
  return: { from: ['submitted'], to: 'returned', verb: 'returned with comments' },
};

export interface TransitionRequest {
  project: ProjectRow;
  version: number;
  transition: Transition;
  note: string;
  user: { id: string; email: string; name: string };
}

/** Why a version cannot make this transition, in words a user can act on. */
function refusal(transition: Transition, version: number, status: VersionStatus, latest: number): string {
  if (status === 'approved') return `Version ${version} is approved and frozen: it cannot change. Edit the network to make a new version and submit that.`;
  if (transition === 'submit' && status === 'submitted') return `Version ${version} is already submitted and waiting for a reviewer`;
  if (transition === 'submit' && version !== latest) return `Version ${version} is not the latest (version ${latest} is); submit the latest version`;
  return `Version ${version} is ${status}, not submitted: only a submitted version can be ${RULES[transition].verb}`;
}

/** Applies a transition or throws 409 (wrong state, stale version) / 403 (approving your own submission). */
export async function transitionVersion(ctx: AppContext, req: TransitionRequest): Promise<{ version: number; status: VersionStatus }> {
  const { db } = ctx;
  const rule = RULES[req.transition];
  const current = await loadVersion(db, req.project.id, req.version);
  const [latestRow] = await db
    .select({ version: networkVersions.version })
    .from(networkVersions)
    .where(eq(networkVersions.projectId, req.project.id))
    .orderBy(desc(networkVersions.version))
    .limit(1);
  const latest = latestRow?.version ?? req.version;
  if (!rule.from.includes(current.status) || (req.transition === 'submit' && req.version !== latest)) {
    throw new ApiError('conflict', refusal(req.transition, req.version, current.status, latest), {
      fields: [{ path: 'version', message: `status is ${current.status}` }],
    });
  }
  if (req.transition === 'approve') {
    const [submitter] = await db
      .select({ id: networkVersions.statusBy })
      .from(networkVersions)
      .where(and(eq(networkVersions.projectId, req.project.id), eq(networkVersions.version, req.version)));
    if (submitter?.id === req.user.id) throw new ApiError('forbidden', `You submitted version ${req.version}; a second person must approve it`);
  }
  const now = new Date();
  const done = await db.transaction(async (tx) => {
    const updated = await tx
      .update(networkVersions)
      .set({ status: rule.to, statusAt: now, statusBy: req.user.id, statusNote: req.note })
      .where(and(eq(networkVersions.projectId, req.project.id), eq(networkVersions.version, req.version), inArray(networkVersions.status, rule.from)))
      .returning({ version: networkVersions.version });
    if (updated.length === 0) return false;
    await audit(tx, {
      teamId: req.project.teamId,
      user: req.user,
      action: `review.${req.transition}`,
      target: req.project.id,
      detail: { version: req.version, from: current.status, to: rule.to, ...(req.note ? { note: req.note } : {}) },
    });
    return true;
  });
  if (!done) {
    const now2 = await loadVersion(db, req.project.id, req.version);
    throw new ApiError('conflict', `Someone changed version ${req.version} first: ${refusal(req.transition, req.version, now2.status, latest)}`);
  }
  await mailTransition(ctx, req, rule.verb);
  return { version: req.version, status: rule.to };
}

/** Link to the Review tab at a version. */
export function versionLink(ctx: AppContext, projectId: string, version: number): string {
  return `${ctx.config.publicUrl}/projects/${projectId}/review?version=${version}`;
}

/**
 * The people concerned: on submit the reviewers and owners; on a decision the designers (and
 * whoever submitted) and owners. Never the person acting.
 */
async function recipients(ctx: AppContext, req: TransitionRequest): Promise<string[]> {
  const roles: Role[] = req.transition === 'submit' ? ['reviewer', 'owner'] : ['designer', 'owner'];
  const rows = await ctx.db
    .select({ email: users.email, id: users.id })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.teamId, req.project.teamId), arrayOverlaps(memberships.roles, roles)));
  return [...new Set(rows.filter((r) => r.id !== req.user.id).map((r) => r.email))].sort();
}

async function mailTransition(ctx: AppContext, req: TransitionRequest, verb: string): Promise<void> {
  const open = await ctx.db
    .select({ n: sql<number>`count(*)::int` })
    .from(reviewComments)
    .where(and(eq(reviewComments.projectId, req.project.id), eq(reviewComments.resolved, false), sql`${reviewComments.parentId} is null`));
  const link = versionLink(ctx, req.project.id, req.version);
  const subject = `${req.project.name}: version ${req.version} ${verb}`;
  const text = [
    `${req.user.name} ${verb === 'submitted for review' ? 'submitted' : verb.split(' ')[0]} version ${req.version} of "${req.project.name}"${req.transition === 'submit' ? ' for review' : ''}.`,
    ...(req.note ? ['', `Note: ${req.note}`] : []),
    ...(req.transition === 'return' ? ['', `Open comments: ${open[0]?.n ?? 0}. They are pinned on the Layout and listed on the Review tab.`] : []),
    ...(req.transition === 'approve' ? ['', 'The approved version is frozen; later edits make new versions that need their own approval.'] : []),
    '',
    'Open the version:',
    link,
  ].join('\n');
  for (const to of await recipients(ctx, req)) {
    try {
      await ctx.mailer.send({ to, teamId: req.project.teamId, subject, text });
    } catch (err) {
      ctx.log(`review mail to ${to} failed: ${err instanceof Error ? err.message : String(err)}`);
    }
  }
}

/** The seed's submitted demo version: the same state change and audit entry, without mail (no mailer at seed time). */
export async function markSubmitted(
  db: Db,
  v: { projectId: string; teamId: string; version: number; user: { id: string; email: string }; note: string },
): Promise<void> {
  await db.transaction(async (tx) => {
    await tx
      .update(networkVersions)
      .set({ status: 'submitted', statusAt: new Date(), statusBy: v.user.id, statusNote: v.note })
      .where(and(eq(networkVersions.projectId, v.projectId), eq(networkVersions.version, v.version)));
    await audit(tx, {
      teamId: v.teamId,
      user: v.user,
      action: 'review.submit',
      target: v.projectId,
      detail: { version: v.version, from: 'draft', to: 'submitted', note: v.note },
    });
  });
}
