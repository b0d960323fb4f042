/** /api/projects/:id/versions/:version/{submit,approve,return} and /api/projects/:id/comments: the sign-off workflow. */
import { z } from 'zod';
import type { ApiRoutes } from '../api-routes';
import type { AppContext } from '../context';
import { parseBody } from '../errors';
import { projectOf } from '../project-scope';
import { addComment, listThreads, setResolved } from '../review/comments';
import { transitionVersion, type Transition } from '../review/signoff';
import { versionNumber, versionParam } from './versions';

const note = z.string({ error: 'must be a string' }).trim().max(2000, 'must be at most 2000 characters');
const optionalNote = z.object({ note: note.optional() });
const requiredNote = z.object({ note: note.min(1, 'say what needs changing (a returned design needs a note)') });

const finite = z.number({ error: 'must be a number' }).finite('must be a finite number');
const commentBody = z
  .object({
    version: versionNumber(1),
    body: z.string({ error: 'must be a string' }).trim().min(1, 'must not be empty').max(4000, 'must be at most 4000 characters'),
    element: z.string({ error: 'must be a string' }).min(1, 'must not be empty').max(100).optional(),
    x_m: finite.optional(),
    y_m: finite.optional(),
    parentId: z.string({ error: 'must be a string' }).optional(),
  })
  .refine((b) => (b.x_m === undefined) === (b.y_m === undefined), { message: 'x_m and y_m go together', path: ['y_m'] });

const resolveBody = z.object({ resolved: z.boolean({ error: 'must be true or false' }) });

export function reviewRoutes(api: ApiRoutes, ctx: AppContext): void {
  const { db } = ctx;

  const transition = (name: Transition, body: z.ZodType<{ note?: string }>) => async (req: import('express').Request, res: import('express').Response) => {
    const parsed = parseBody(body, req.body);
    const project = projectOf(req);
    res.json(
      await transitionVersion(ctx, {
        project,
        version: versionParam(req.params.version),
        transition: name,
        note: parsed.note ?? '',
        user: req.user!,
      }),
    );
  };
  api.post('/projects/:id/versions/:version/submit', 'review.submit', transition('submit', optionalNote));
  api.post('/projects/:id/versions/:version/approve', 'review.decide', transition('approve', optionalNote));
  api.post('/projects/:id/versions/:version/return', 'review.decide', transition('return', requiredNote));

  api.get('/projects/:id/comments', 'review.read', async (req, res) => {
    const project = projectOf(req);
    const version = req.query.version === undefined ? undefined : versionParam(req.query.version);
    res.json({ threads: await listThreads(db, project.id, version) });
  });

  api.post('/projects/:id/comments', 'review.comment', async (req, res) => {
    const body = parseBody(commentBody, req.body);
    res.status(201).json(await addComment(db, projectOf(req), req.user!, body));
  });

  api.patch('/projects/:id/comments/:commentId', 'review.comment', async (req, res) => {
    const body = parseBody(resolveBody, req.body);
    res.json(await setResolved(db, projectOf(req), req.user!, String(req.params.commentId), body.resolved));
  });
}
