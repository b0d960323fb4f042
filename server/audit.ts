/** Writing an audit-log entry, inside the caller's transaction so it commits with the change. */
import { auditLog } from '../drizzle/schema';
import type { DbOrTx } from './db';

export interface AuditEntry {
  teamId: string | null;
  user: { id: string; email: string } | null;
  action: string;
  target?: string;
  detail?: Record<string, unknown>;
}

export async function audit(db: DbOrTx, entry: AuditEntry): Promise<void> {
  await db.insert(auditLog).values({
    teamId: entry.teamId,
    userId: entry.user?.id ?? null,
    userEmail: entry.user?.email ?? null,
    action: entry.action,
    target: entry.target ?? '',
    detail: entry.detail ?? {},
  });
}
