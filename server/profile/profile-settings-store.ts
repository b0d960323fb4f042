/**
 * A project's Profile settings as stored (profile_settings): today the default cover over pipes
 * without their own. Read by the Profile route and by everything that checks a design on the server
 * (options, takeoff, sizing), so the checks use the cover the designer set.
 */
import { eq } from 'drizzle-orm';
import { DEFAULT_COVER_M } from '../../engine/checks';
import { profileSettings, users } from '../../drizzle/schema';
import type { DbOrTx } from '../db';

export interface ProfileSettings {
  /** Default cover for pipes without their own, m; null: the engine's default. */
  cover_m: number | null;
  /** The engine's default cover, m (what null means). */
  default_cover_m: number;
  updatedAt: string | null;
  updatedBy: string | null;
}

export async function loadProfileSettings(db: DbOrTx, projectId: string): Promise<ProfileSettings> {
  const [row] = await db
    .select({ settings: profileSettings.settings, updatedAt: profileSettings.updatedAt, userName: users.name })
    .from(profileSettings)
    .leftJoin(users, eq(users.id, profileSettings.updatedBy))
    .where(eq(profileSettings.projectId, projectId));
  const cover = (row?.settings as { cover_m?: number | null } | undefined)?.cover_m ?? null;
  return { cover_m: cover, default_cover_m: DEFAULT_COVER_M, updatedAt: row?.updatedAt.toISOString() ?? null, updatedBy: row?.userName ?? null };
}
