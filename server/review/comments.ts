/**
 * Review comments: a thread starts with a comment pinned to an element of the version (or to a
 * point on the plan), replies hang under it, and the thread is resolved or reopened as a whole.
 * An approved version is frozen: new threads on it are refused.
 */
import { and, asc, eq } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { reviewComments, users } from '../../drizzle/schema';
import { audit } from '../audit';
import type { Db } from '../db';
import { ApiError } from '../errors';
import { isUuid } from '../ids';
import { loadVersion } from '../network/versions-store';
import type { ProjectRow } from '../project-scope';
import type { NewComment, ReviewComment, ReviewThread } from '../../shared/review-api';

export type CommentJson = ReviewComment;
export type ThreadJson = ReviewThread;

const author = alias(users, 'author');
const resolver = alias(users, 'resolver');

/** Every thread of a project (optionally of one version), oldest first, replies nested. */
export async function listThreads(db: Db, projectId: string, version?: number): Promise<ThreadJson[]> {
  const rows = await db
    .select({
      id: reviewComments.id,
      version: reviewComments.version,
      parentId: reviewComments.parentId,
      element: reviewComments.element,
      x_m: reviewComments.xM,
      y_m: reviewComments.yM,
      body: reviewComments.body,
      resolved: reviewComments.resolved,
      resolvedAt: reviewComments.resolvedAt,
      resolvedBy: resolver.name,
      createdAt: reviewComments.createdAt,
      createdBy: author.name,
    })
    .from(reviewComments)
    .leftJoin(author, eq(author.id, reviewComments.createdBy))
    .leftJoin(resolver, eq(resolver.id, reviewComments.resolvedBy))
    .where(eq(reviewComments.projectId, projectId))
    .orderBy(asc(reviewComments.createdAt), asc(reviewComments.id));
  const json = rows.map((r): CommentJson => ({ ...r, createdAt: r.createdAt.toISOString(), resolvedAt: r.resolvedAt?.toISOString() ?? null }));
  const threads = json
    .filter((c) => c.parentId === null && (version === undefined || c.version === version))
    .map((c) => ({ ...c, replies: [] as CommentJson[] }));
  const byId = new Map(threads.map((t) => [t.id, t]));
  for (const c of json) if (c.parentId) byId.get(c.parentId)?.replies.push(c);
  return threads;
}

/** Adds a thread or a reply; 400 naming the field for an unknown element or parent, 409 on an approved version. */
export async function addComment(db: Db, project: ProjectRow, user: { id: string; email: string }, c: NewComment): Promise<CommentJson> {
  const version = await loadVersion(db, project.id, c.version);
  let parent: { id: string; version: number; parentId: string | null } | undefined;
  if (c.parentId !== undefined) {
    if (isUuid(c.parentId)) {
      [parent] = await db
        .select({ id: reviewComments.id, version: reviewComments.version, parentId: reviewComments.parentId })
        .from(reviewComments)
        .where(and(eq(reviewComments.id, c.parentId), eq(reviewComments.projectId, project.id)));
    }
    if (!parent)
      throw new ApiError('validation', `parentId: no comment ${c.parentId} in this project`, {
        fields: [{ path: 'parentId', message: 'no such comment in this project' }],
      });
    if (c.element !== undefined || c.x_m !== undefined)
      throw new ApiError('validation', "A reply is not pinned: send element or x_m/y_m only on a thread's first comment", {
        fields: [{ path: c.element !== undefined ? 'element' : 'x_m', message: 'not allowed on a reply' }],
      });
  } else {
    if (version.status === 'approved') {
      throw new ApiError('conflict', `Version ${c.version} is approved and frozen: it cannot change. Comment on the current version instead.`, {
        fields: [{ path: 'version', message: 'approved' }],
      });
    }
    if (c.element === undefined && c.x_m === undefined)
      throw new ApiError('validation', 'Pin the comment to an element or to a point on the plan (element, or x_m and y_m)', {
        fields: [{ path: 'element', message: 'element or x_m/y_m is required' }],
      });
    if (c.element !== undefined && ![...version.document.nodes, ...version.document.links].some((e) => e.id === c.element)) {
      throw new ApiError('validation', `element: ${c.element} is not an element of version ${c.version}`, {
        fields: [{ path: 'element', message: `no element ${c.element} in version ${c.version}` }],
      });
    }
  }
  const [row] = await db.transaction(async (tx) => {
    const inserted = await tx
      .insert(reviewComments)
      .values({
        projectId: project.id,
        version: parent?.version ?? c.version,
        parentId: parent ? (parent.parentId ?? parent.id) : null,
        element: c.element ?? null,
        xM: c.x_m ?? null,
        yM: c.y_m ?? null,
        body: c.body,
        createdBy: user.id,
      })
      .returning({ id: reviewComments.id });
    await audit(tx, {
      teamId: project.teamId,
      user,
      action: parent ? 'review.reply' : 'review.comment',
      target: project.id,
      detail: { version: parent?.version ?? c.version, comment: inserted[0].id, ...(c.element ? { element: c.element } : {}) },
    });
    return inserted;
  });
  const all = await listThreads(db, project.id);
  return all.flatMap((t): CommentJson[] => [t, ...t.replies]).find((x) => x.id === row.id)!;
}

/** Resolves or reopens a thread (a reply's id resolves its thread). */
export async function setResolved(db: Db, project: ProjectRow, user: { id: string; email: string }, commentId: string, resolved: boolean): Promise<ThreadJson> {
  const id = isUuid(commentId) ? commentId : null;
  const [row] = id
    ? await db
        .select({ id: reviewComments.id, parentId: reviewComments.parentId })
        .from(reviewComments)
        .where(and(eq(reviewComments.id, id), eq(reviewComments.projectId, project.id)))
    : [];
  if (!row) throw new ApiError('not-found', 'No such comment in this project');
  const threadId = row.parentId ?? row.id;
  await db.transaction(async (tx) => {
    await tx
      .update(reviewComments)
      .set({ resolved, resolvedAt: resolved ? new Date() : null, resolvedBy: resolved ? user.id : null })
      .where(eq(reviewComments.id, threadId));
    await audit(tx, { teamId: project.teamId, user, action: resolved ? 'review.resolve' : 'review.reopen', target: project.id, detail: { comment: threadId } });
  });
  return (await listThreads(db, project.id)).find((t) => t.id === threadId)!;
}
