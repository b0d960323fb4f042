/**
 * Storing a walk's sync: the rows keyed by the phone's ids (a retry inserts nothing) and the walk's
 * GPX survey file rebuilt from all rows of the walk. Used by PUT /api/projects/:id/walks/:walkId
 * and by the demo seed.
 */
import { and, asc, eq, inArray } from 'drizzle-orm';
import { files, walkPoints } from '../../drizzle/schema';
import { audit } from '../audit';
import type { DbOrTx } from '../db';
import { ApiError } from '../errors';
import { walkGpx } from './walk-gpx';
import type { TrackPoint, WalkBody, WalkPoint } from './walk-types';

export interface SyncOutcome {
  walkId: string;
  fileId: string;
  filename: string;
  added: number;
  points: number;
  track: number;
}

export async function readWalk(db: DbOrTx, projectId: string, walkId: string): Promise<{ points: WalkPoint[]; track: TrackPoint[] }> {
  const rows = await db
    .select()
    .from(walkPoints)
    .where(and(eq(walkPoints.projectId, projectId), eq(walkPoints.walkId, walkId)))
    .orderBy(asc(walkPoints.recordedAt), asc(walkPoints.id));
  const points: WalkPoint[] = [];
  const track: TrackPoint[] = [];
  for (const r of rows) {
    const data = { ...(r.data as object), id: r.id, recordedAt: r.recordedAt.toISOString() };
    if (r.type === 'point') points.push(data as WalkPoint);
    else track.push(data as TrackPoint);
  }
  return { points, track };
}

/** Call inside a transaction: rows, file and audit entry commit together. */
export async function syncWalk(
  tx: DbOrTx,
  {
    project,
    walkId,
    body,
    user,
  }: { project: { id: string; teamId: string; name: string }; walkId: string; body: WalkBody; user: { id: string; email: string } },
): Promise<SyncOutcome> {
  const photoIds = [...new Set(body.points.flatMap((p) => (p.photo_id ? [p.photo_id] : [])))];
  if (photoIds.length > 0) {
    const found = await tx
      .select({ id: files.id })
      .from(files)
      .where(and(eq(files.projectId, project.id), eq(files.kind, 'photo'), inArray(files.id, photoIds)));
    const missing = photoIds.filter((id) => !found.some((f) => f.id === id));
    if (missing.length > 0) {
      const labels = body.points.filter((p) => p.photo_id && missing.includes(p.photo_id)).map((p) => p.label);
      throw new ApiError('validation', `The photo of ${labels.join(', ')} has not been uploaded yet`, {
        fields: labels.map((l) => ({ path: 'points', element: l, message: 'photo not uploaded yet' })),
      });
    }
  }
  const [existing] = await tx.select({ projectId: files.projectId, kind: files.kind, filename: files.filename }).from(files).where(eq(files.id, walkId));
  if (existing && (existing.projectId !== project.id || existing.kind !== 'survey')) throw new ApiError('conflict', 'That walk id is already in use');
  const rows = [
    ...body.points.map(({ id, recordedAt, ...data }) => ({ id, recordedAt: new Date(recordedAt), data, type: 'point' as const })),
    ...body.track.map(({ id, recordedAt, ...data }) => ({ id, recordedAt: new Date(recordedAt), data, type: 'track' as const })),
  ].map((r) => ({ ...r, projectId: project.id, walkId, createdBy: user.id }));
  let added = 0;
  // Chunks keep each statement's parameter count well under PostgreSQL's 65 535.
  for (let i = 0; i < rows.length; i += 1000) {
    const inserted = await tx
      .insert(walkPoints)
      .values(rows.slice(i, i + 1000))
      .onConflictDoNothing()
      .returning({ id: walkPoints.id });
    added += inserted.length;
  }
  const walk = await readWalk(tx, project.id, walkId);
  const filename = existing?.filename ?? `walk-${body.name.replace(/[\\/\r\n"]/g, '_').slice(0, 60)}.gpx`;
  const gpx = Buffer.from(
    walkGpx(body.name, walk.points, walk.track, (photo) => `/api/projects/${project.id}/files/${photo}`),
    'utf8',
  );
  if (existing) {
    if (added > 0) await tx.update(files).set({ bytes: gpx, size: gpx.length }).where(eq(files.id, walkId));
  } else {
    await tx.insert(files).values({
      id: walkId,
      projectId: project.id,
      kind: 'survey',
      filename,
      mime: 'application/gpx+xml',
      size: gpx.length,
      bytes: gpx,
      createdBy: user.id,
    });
  }
  if (added > 0 || !existing) {
    await audit(tx, {
      teamId: project.teamId,
      user,
      action: 'walk.sync',
      target: filename,
      detail: { projectId: project.id, projectName: project.name, walkId, added, points: walk.points.length, track: walk.track.length },
    });
  }
  return { walkId, fileId: walkId, filename, added, points: walk.points.length, track: walk.track.length };
}
