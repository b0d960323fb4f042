/**
 * /api/projects/:id/profile-settings: the Profile's per-project settings, today the default cover
 * over pipes that have no cover of their own (a pipe's cover_m in the network wins). Any member
 * reads them; designers change them (validated, audited). No stored row means the engine's default.
 */
import { z } from 'zod';
import { profileSettings } from '../../drizzle/schema';
import type { ApiRoutes } from '../api-routes';
import { audit } from '../audit';
import type { AppContext } from '../context';
import { parseBody } from '../errors';
import { loadProfileSettings } from '../profile/profile-settings-store';
import { projectOf } from '../project-scope';

/** Deepest default cover accepted, m: beyond any frost depth a farm line is laid at (about 10 ft). */
export const MAX_COVER_M = 3;

const settingsBody = z
  .object({
    cover_m: z
      .number({ error: 'must be a depth in metres, or null for the default' })
      .finite('must be a finite number')
      .min(0, 'must be 0 m or more')
      .max(MAX_COVER_M, `must be at most ${MAX_COVER_M} m (about 10 ft)`)
      .nullable(),
  })
  .strict();

export function profileRoutes(api: ApiRoutes, ctx: AppContext): void {
  const { db } = ctx;

  api.get('/projects/:id/profile-settings', 'project.read', async (req, res) => {
    res.json(await loadProfileSettings(db, projectOf(req).id));
  });

  api.put('/projects/:id/profile-settings', 'profile.write', async (req, res) => {
    const body = parseBody(settingsBody, req.body, 'The profile settings are not valid');
    const project = projectOf(req);
    const before = await loadProfileSettings(db, project.id);
    await db.transaction(async (tx) => {
      await tx
        .insert(profileSettings)
        .values({ projectId: project.id, settings: body, updatedBy: req.user!.id })
        .onConflictDoUpdate({ target: profileSettings.projectId, set: { settings: body, updatedAt: new Date(), updatedBy: req.user!.id } });
      await audit(tx, {
        teamId: project.teamId,
        user: req.user!,
        action: 'profile.settings',
        target: project.name,
        detail: { cover_m: body.cover_m ?? 'default', was: before.cover_m ?? 'default' },
      });
    });
    res.json(await loadProfileSettings(db, project.id));
  });
}
