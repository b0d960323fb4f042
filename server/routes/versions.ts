/** /api/projects/:id/versions: the immutable version history, one version, a comparison, a restore. */
import { z } from 'zod';
import type { ApiRoutes } from '../api-routes';
import type { AppContext } from '../context';
import { ApiError, parseBody } from '../errors';
import { saveNetwork, saveSummary } from '../network/network-store';
import { compareVersions, listVersions, loadVersion } from '../network/versions-store';
import { projectOf } from '../project-scope';

/** Versions are stored as PostgreSQL `integer` (drizzle/schema.ts): anything above 2^31 − 1 is refused with 400, never sent to the database. */
export const MAX_VERSION = 2 ** 31 - 1;

/** A version number in a body: an integer from `min` (0: "nothing saved yet" for optimistic checks; 1: a saved version) to MAX_VERSION. */
export const versionNumber = (min: 0 | 1) =>
  z.number({ error: 'must be a number' }).int('must be an integer').min(min, `must be ${min} or more`).max(MAX_VERSION, 'must be below 2^31');

const pathVersion = z
  .string()
  .regex(/^\d{1,10}$/, 'must be a positive integer')
  .transform(Number)
  .pipe(versionNumber(1));

/** A version number from the path or query: a positive integer below 2^31, or 400 naming the parameter. */
export function versionParam(value: unknown, name = 'version'): number {
  const parsed = pathVersion.safeParse(value);
  if (!parsed.success) {
    const message = parsed.error.issues[0]?.message ?? 'must be a positive integer';
    throw new ApiError('validation', `${name} must be a version number (1 to ${MAX_VERSION}), got "${String(value).slice(0, 40)}"`, {
      fields: [{ path: name, message }],
    });
  }
  return parsed.data;
}

const restoreBody = z.object({
  /** The current version the client has loaded (optimistic check, like a save). */
  version: versionNumber(0),
});

export function versionRoutes(api: ApiRoutes, ctx: AppContext): void {
  const { db } = ctx;

  api.get('/projects/:id/versions', 'network.read', async (req, res) => {
    const project = projectOf(req);
    res.json({ versions: await listVersions(db, project.id) });
  });

  api.get('/projects/:id/versions/:version', 'network.read', async (req, res) => {
    const project = projectOf(req);
    res.json(await loadVersion(db, project.id, versionParam(req.params.version)));
  });

  api.get('/projects/:id/versions/:version/compare/:other', 'network.read', async (req, res) => {
    const project = projectOf(req);
    res.json(await compareVersions(db, project.id, versionParam(req.params.version), versionParam(req.params.other, 'other')));
  });

  api.post('/projects/:id/versions/:version/restore', 'network.write', async (req, res) => {
    const body = parseBody(restoreBody, req.body);
    const project = projectOf(req);
    const old = await loadVersion(db, project.id, versionParam(req.params.version));
    res.status(201).json(
      saveSummary(
        await saveNetwork(db, {
          projectId: project.id,
          teamId: project.teamId,
          user: req.user!,
          expectedVersion: body.version,
          document: old.document,
          log: ctx.log,
          restoredFrom: old.version,
        }),
      ),
    );
  });
}
