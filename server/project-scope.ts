/**
 * The project of a `/projects/:id…` route, loaded once onto the request. ApiRoutes mounts
 * `loadProject` after the permission guard on every route whose path starts with `/projects/:id`,
 * so a handler never forgets the team check: another team's project (or a malformed id) is 404,
 * never 403, and the handler reads the row with `projectOf(req)`.
 */
import type { Request, RequestHandler } from 'express';
import { and, eq } from 'drizzle-orm';
import { projects } from '../drizzle/schema';
import type { DbOrTx } from './db';
import { ApiError } from './errors';
import { uuidParam } from './ids';

export type ProjectRow = typeof projects.$inferSelect;

/** Paths under this prefix get the project loaded (server/api-routes.ts). */
export const PROJECT_PATH = /^\/projects\/:id(\/|$)/;

/** The project `id` of team `teamId`, or 404. Use inside a transaction to re-read the row. */
export async function findTeamProject(db: DbOrTx, teamId: string, rawId: unknown): Promise<ProjectRow> {
  const id = uuidParam(rawId, 'No such project');
  const [row] = await db
    .select()
    .from(projects)
    .where(and(eq(projects.id, id), eq(projects.teamId, teamId)));
  if (!row) throw new ApiError('not-found', 'No such project');
  return row;
}

/** Sets req.project to the project `:id` of the caller's current team (404 otherwise). */
export function loadProject(db: DbOrTx): RequestHandler {
  return async (req, _res, next) => {
    if (!req.membership) return next(new ApiError('not-found', 'No such project'));
    req.project = await findTeamProject(db, req.membership.teamId, req.params['id']);
    next();
  };
}

/** The project loadProject put on the request; a route outside /projects/:id calling this is a programming error. */
export function projectOf(req: Request): ProjectRow {
  if (!req.project) throw new Error(`projectOf: ${req.method} ${req.route?.path ?? req.path} has no project (path must start with /projects/:id)`);
  return req.project;
}
