/** /api/projects/:id/budget: load (with its plan), and save with an optimistic version. */
import type { ApiRoutes } from '../api-routes';
import { saveBudgetBody } from '../budget/budget-shape';
import { loadBudget, saveBudget } from '../budget/budget-store';
import type { AppContext } from '../context';
import { parseBody } from '../errors';
import { projectOf } from '../project-scope';

export function budgetRoutes(api: ApiRoutes, ctx: AppContext): void {
  const { db } = ctx;

  api.get('/projects/:id/budget', 'budget.read', async (req, res) => {
    res.json(await loadBudget(db, projectOf(req).id));
  });

  api.put('/projects/:id/budget', 'budget.write', async (req, res) => {
    const body = parseBody(saveBudgetBody, req.body);
    const project = projectOf(req);
    res.json(
      await saveBudget(db, {
        projectId: project.id,
        projectName: project.name,
        teamId: project.teamId,
        user: req.user!,
        expectedVersion: body.version,
        document: body.document,
        applyOutlets: body.apply_outlets,
        log: ctx.log,
      }),
    );
  });
}
