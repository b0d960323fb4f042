/** /api/team/audit: the current team's audit log, newest first (admins). */
import { desc, eq } from 'drizzle-orm';
import { auditLog } from '../../drizzle/schema';
import type { ApiRoutes } from '../api-routes';
import type { AppContext } from '../context';

/** An audit detail object as one readable line: `roles: estimator, owner; version: 3`. */
export function describeDetail(detail: unknown): string {
  if (!detail || typeof detail !== 'object') return '';
  return Object.entries(detail).map(([k, v]) => `${k}: ${Array.isArray(v) ? v.join(', ') : String(v)}`).join('; ');
}

export function auditRoutes(api: ApiRoutes, ctx: AppContext): void {
  api.get('/team/audit', 'audit.read', async (req, res) => {
    const rows = await ctx.db.select({
      id: auditLog.id, at: auditLog.at, userEmail: auditLog.userEmail, action: auditLog.action,
      target: auditLog.target, detail: auditLog.detail,
    }).from(auditLog).where(eq(auditLog.teamId, req.membership!.teamId)).orderBy(desc(auditLog.id)).limit(200);
    res.json(rows.map((e) => ({ ...e, id: String(e.id), detail: describeDetail(e.detail) })));
  });
}
