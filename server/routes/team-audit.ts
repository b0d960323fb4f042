/** /api/team/audit: the current team's audit log, newest first (admins), in names rather than ids. */
import { desc, eq, inArray } from 'drizzle-orm';
import { auditLog, projects, users } from '../../drizzle/schema';
import type { ApiRoutes } from '../api-routes';
import type { AppContext } from '../context';
import { isUuid } from '../ids';

/** Names for the ids an entry may carry (projects of the team). */
export type AuditNames = ReadonlyMap<string, string>;

/**
 * An audit detail object as one readable line: `roles: estimator, owner; version: 3`. A project id
 * is shown as `project: <name>` (or `project: (deleted)`); other ids (walk, file, user) are left out,
 * since the target and the other fields already say what was touched.
 */
export function describeDetail(detail: unknown, names: AuditNames = new Map()): string {
  if (!detail || typeof detail !== 'object') return '';
  const entries = Object.entries(detail as Record<string, unknown>);
  const hasProjectName = entries.some(([k]) => k === 'projectName');
  return entries
    .flatMap(([k, v]) => {
      if (k === 'projectId' && typeof v === 'string') return hasProjectName ? [] : [`project: ${names.get(v) ?? '(deleted)'}`];
      if (k === 'projectName') return [`project: ${String(v)}`];
      if (/Id$/.test(k) && typeof v === 'string' && isUuid(v)) return [];
      return [`${k}: ${Array.isArray(v) ? v.join(', ') : String(v)}`];
    })
    .join('; ');
}

/** Who did it: the user's name (their e-mail if the account is gone), or Runnel itself (the demo seed). */
function who(name: string | null, email: string | null, action: string): string {
  if (name) return name;
  if (email) return email;
  return action === 'seed' ? 'Runnel (demo set-up)' : 'Runnel';
}

export function auditRoutes(api: ApiRoutes, ctx: AppContext): void {
  api.get('/team/audit', 'audit.read', async (req, res) => {
    const teamId = req.membership!.teamId;
    const rows = await ctx.db
      .select({
        id: auditLog.id,
        at: auditLog.at,
        userEmail: auditLog.userEmail,
        userName: users.name,
        action: auditLog.action,
        target: auditLog.target,
        detail: auditLog.detail,
      })
      .from(auditLog)
      .leftJoin(users, eq(users.id, auditLog.userId))
      .where(eq(auditLog.teamId, teamId))
      .orderBy(desc(auditLog.id))
      .limit(200);
    // Project ids appear as targets (network saves) and in details: name them in one query.
    const ids = new Set<string>();
    for (const r of rows) {
      if (isUuid(r.target)) ids.add(r.target);
      const pid = (r.detail as { projectId?: unknown } | null)?.projectId;
      if (typeof pid === 'string' && isUuid(pid)) ids.add(pid);
    }
    const named =
      ids.size === 0
        ? []
        : await ctx.db
            .select({ id: projects.id, name: projects.name })
            .from(projects)
            .where(inArray(projects.id, [...ids]));
    const names: AuditNames = new Map(named.map((p) => [p.id, p.name]));
    res.json(
      rows.map((e) => ({
        id: String(e.id),
        at: e.at,
        who: who(e.userName, e.userEmail, e.action),
        userEmail: e.userEmail,
        action: e.action,
        target: isUuid(e.target) ? (names.get(e.target) ?? 'a deleted project') : e.target,
        detail: describeDetail(e.detail, names),
      })),
    );
  });
}
