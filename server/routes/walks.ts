/**
 * /api/projects/:id/walks: what phones recorded in Walk mode. A sync sends the whole recording;
 * rows are keyed by the phone's own ids, so a retry adds nothing and two phones never collide.
 * The walk's survey file (files row whose id is the walk id) is rebuilt from the rows each time.
 */
import { eq } from 'drizzle-orm';
import { files } from '../../drizzle/schema';
import type { ApiRoutes } from '../api-routes';
import { audit } from '../audit';
import type { AppContext } from '../context';
import { ApiError, parseBody } from '../errors';
import { readWalk, syncWalk } from '../walk/walk-store';
import { walkBodySchema } from '../walk/walk-types';
import { imageType, requireFile, singleFile } from './files';
import { isUuid } from '../ids';
import { projectOf } from '../project-scope';

/** A phone compresses photos to well under this (client/src/app/screens/walk/photo.ts). */
export const PHOTO_MAX_BYTES = 2 * 1024 * 1024;

/** An id the phone made: a UUID, or 400 naming the parameter. */
function clientId(value: unknown, what: string): string {
  const id = String(value);
  if (!isUuid(id)) throw new ApiError('validation', `${what} must be a UUID`, { fields: [{ path: what, message: 'must be a UUID' }] });
  return id;
}

export function walkRoutes(api: ApiRoutes, ctx: AppContext): void {
  const { db } = ctx;

  api.put('/projects/:id/walks/:walkId', 'files.write', async (req, res) => {
    const project = projectOf(req);
    const walkId = clientId(req.params.walkId, 'walkId');
    const body = parseBody(walkBodySchema, req.body, 'The walk could not be synced');
    const result = await db.transaction((tx) => syncWalk(tx, { project, walkId, body, user: req.user! }));
    res.json(result);
  });

  api.get('/projects/:id/walks/:walkId', 'files.read', async (req, res) => {
    const project = projectOf(req);
    const walkId = String(req.params.walkId);
    if (!isUuid(walkId)) throw new ApiError('not-found', 'No such walk');
    const walk = await readWalk(db, project.id, walkId);
    if (walk.points.length === 0 && walk.track.length === 0) throw new ApiError('not-found', 'No such walk');
    res.json({ walkId, ...walk });
  });

  api.put('/projects/:id/walks/:walkId/photos/:photoId', 'files.write', singleFile(PHOTO_MAX_BYTES), async (req, res) => {
    const project = projectOf(req);
    clientId(req.params.walkId, 'walkId');
    const photoId = clientId(req.params.photoId, 'photoId');
    const file = requireFile(req.file);
    const mime = imageType(file.buffer);
    if (!mime) throw new ApiError('unsupported-type', `A photo must be a JPEG or PNG image; "${file.originalname}" is neither`);
    const [existing] = await db.select({ projectId: files.projectId }).from(files).where(eq(files.id, photoId));
    if (existing) {
      if (existing.projectId !== project.id) throw new ApiError('conflict', 'That photo id is already in use');
      res.status(200).json({ id: photoId, created: false });
      return;
    }
    const filename = file.originalname.replace(/[\\/\r\n"]/g, '_').slice(0, 200) || 'photo.jpg';
    await db.transaction(async (tx) => {
      await tx
        .insert(files)
        .values({
          id: photoId,
          projectId: project.id,
          kind: 'photo',
          filename,
          mime,
          size: file.size,
          bytes: file.buffer,
          createdBy: req.user!.id,
        })
        .onConflictDoNothing();
      await audit(tx, {
        teamId: project.teamId,
        user: req.user!,
        action: 'file.upload',
        target: filename,
        detail: { projectId: project.id, projectName: project.name, kind: 'photo', size: file.size },
      });
    });
    res.status(201).json({ id: photoId, created: true });
  });
}
