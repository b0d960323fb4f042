/** /api/projects/:id/network: load, and save with an optimistic version. */
import type { ApiRoutes } from '../api-routes';
import type { AppContext } from '../context';
import { parseBody } from '../errors';
import { saveNetworkBody } from '../network/document-shape';
import { loadNetwork, saveNetwork } from '../network/network-store';
import { projectOf } from '../project-scope';

export function networkRoutes(api: ApiRoutes, ctx: AppContext): void {
  const { db } = ctx;

  api.get('/projects/:id/network', 'network.read', async (req, res) => {
    const project = projectOf(req);
    res.json(await loadNetwork(db, project.id));
  });

  api.put('/projects/:id/network', 'network.write', async (req, res) => {
    const body = parseBody(saveNetworkBody, req.body);
    const project = projectOf(req);
    res.json(await saveNetwork(db, {
      projectId: project.id, teamId: project.teamId, user: req.user!, expectedVersion: body.version,
      document: body.document, log: ctx.log,
    }));
  });
}
