/** /api/projects/:id/versions: the immutable version history, one version, a comparison, a restore. */
import { z } from 'zod';
import type { ApiRoutes } from '../api-routes';
import type { AppContext } from '../context';
import { ApiError, parseBody } from '../errors';
import { saveNetwork } from '../network/network-store';
import { compareVersions, listVersions, loadVersion } from '../network/versions-store';
import { projectOf } from '../project-scope';

/** A version number from the path: a positive integer, or 400 naming the parameter. */
export function versionParam(value: unknown, name = 'version'): number {
  const n = typeof value === 'string' && /^\d{1,9}$/.test(value) ? Number(value) : NaN;
  if (!Number.isInteger(n) || n < 1) {
    throw new ApiError('validation', `${name} must be a version number (1 or more), got "${String(value)}"`, { fields: [{ path: name, message: 'must be a positive integer' }] });
  }
  return n;
}

const restoreBody = z.object({
  /** The current version the client has loaded (optimistic check, like a save). */
  version: z.number({ error: 'must be a number' }).int('must be an integer').min(0, 'must be 0 or more'),
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
    res.status(201).json(await saveNetwork(db, {
      projectId: project.id, teamId: project.teamId, user: req.user!, expectedVersion: body.version,
      document: old.document, log: ctx.log, restoredFrom: old.version,
    }));
  });
}
