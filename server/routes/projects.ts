/** /api/projects: the current team's projects. Another team's project is 404, never 403. */
import { and, asc, eq } from 'drizzle-orm';
import { createInsertSchema, createUpdateSchema } from 'drizzle-zod';
import { z } from 'zod';
import { projects } from '../../drizzle/schema';
import type { ApiRoutes } from '../api-routes';
import { audit } from '../audit';
import type { AppContext } from '../context';
import { ApiError, parseBody } from '../errors';
import { projectOf, type ProjectRow } from '../project-scope';

/** Request bodies derived from the table (drizzle-zod), with the limits the API adds. */
const columnRules = {
  name: (s: z.ZodString) => s.trim().min(1, 'is required').max(200),
  siteName: (s: z.ZodString) => s.trim().max(200),
  notes: (s: z.ZodString) => s.max(20000),
};
const editable = { name: true, siteName: true, notes: true, units: true } as const;
const createBody = createInsertSchema(projects, columnRules).pick(editable);
const updateBody = createUpdateSchema(projects, columnRules).pick({ ...editable, archived: true });
const listQuery = z.object({ archived: z.enum(['true', 'false']).optional() });

export function projectJson(row: ProjectRow) {
  return {
    id: row.id,
    teamId: row.teamId,
    name: row.name,
    siteName: row.siteName,
    notes: row.notes,
    units: row.units,
    archived: row.archived,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

export function projectRoutes(api: ApiRoutes, ctx: AppContext): void {
  const { db } = ctx;

  api.get('/projects', 'project.read', async (req, res) => {
    const query = parseBody(listQuery, req.query, 'Invalid query');
    const teamId = req.membership!.teamId;
    const where = query.archived === 'true' ? eq(projects.teamId, teamId) : and(eq(projects.teamId, teamId), eq(projects.archived, false));
    const rows = await db.select().from(projects).where(where).orderBy(asc(projects.name));
    res.json(rows.map(projectJson));
  });

  api.post('/projects', 'project.create', async (req, res) => {
    const body = parseBody(createBody, req.body);
    const teamId = req.membership!.teamId;
    const row = await db.transaction(async (tx) => {
      const [created] = await tx
        .insert(projects)
        .values({ teamId, ...body })
        .returning();
      await audit(tx, { teamId, user: req.user!, action: 'project.create', target: created.name, detail: { projectId: created.id } });
      return created;
    });
    res.status(201).json(projectJson(row));
  });

  api.get('/projects/:id', 'project.read', async (req, res) => {
    res.json(projectJson(projectOf(req)));
  });

  api.patch('/projects/:id', 'project.update', async (req, res) => {
    const body = parseBody(updateBody, req.body);
    const row = await db.transaction(async (tx) => {
      const before = projectOf(req);
      const [updated] = await tx
        .update(projects)
        .set({ ...body, updatedAt: new Date() })
        .where(eq(projects.id, before.id))
        .returning();
      if (!updated) throw new ApiError('not-found', 'No such project');
      await audit(tx, {
        teamId: before.teamId,
        user: req.user!,
        action: 'project.update',
        target: updated.name,
        detail: { projectId: before.id, changed: Object.keys(body) },
      });
      return updated;
    });
    res.json(projectJson(row));
  });

  api.delete('/projects/:id', 'project.delete', async (req, res) => {
    await db.transaction(async (tx) => {
      const row = projectOf(req);
      const [gone] = await tx.delete(projects).where(eq(projects.id, row.id)).returning({ id: projects.id });
      if (!gone) throw new ApiError('not-found', 'No such project');
      await audit(tx, { teamId: row.teamId, user: req.user!, action: 'project.delete', target: row.name, detail: { projectId: row.id } });
    });
    res.status(204).end();
  });
}
