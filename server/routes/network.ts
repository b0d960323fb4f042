/** /api/projects/:id/network: load, and save with an optimistic version. */
import { z } from 'zod';
import type { ApiRoutes } from '../api-routes';
import type { AppContext } from '../context';
import { parseBody } from '../errors';
import { loadNetwork, saveNetwork, saveSummary } from '../network/network-store';
import { projectOf } from '../project-scope';
import { versionNumber } from './versions';

/** The body of PUT /api/projects/:id/network; the document is checked by the engine's schema (parseDocument). */
const saveNetworkBody = z.object({
  // versions is an int4 column: 2^31 and above would be a database error, not a stale save.
  version: versionNumber(0),
  document: z.unknown(),
});

export function networkRoutes(api: ApiRoutes, ctx: AppContext): void {
  const { db } = ctx;

  api.get('/projects/:id/network', 'network.read', async (req, res) => {
    const project = projectOf(req);
    res.json(await loadNetwork(db, project.id));
  });

  api.put('/projects/:id/network', 'network.write', async (req, res) => {
    const body = parseBody(saveNetworkBody, req.body);
    const project = projectOf(req);
    res.json(
      saveSummary(
        await saveNetwork(db, {
          projectId: project.id,
          teamId: project.teamId,
          user: req.user!,
          expectedVersion: body.version,
          document: body.document,
          log: ctx.log,
        }),
      ),
    );
  });
}
