/** /api/team/outbox: mail the local sink captured for the current team (admins). */
import { desc, eq } from 'drizzle-orm';
import { outbox } from '../../drizzle/schema';
import type { ApiRoutes } from '../api-routes';
import type { AppContext } from '../context';

export function outboxRoutes(api: ApiRoutes, ctx: AppContext): void {
  api.get('/team/outbox', 'outbox.read', async (req, res) => {
    const rows = await ctx.db
      .select({ id: outbox.id, to: outbox.to, subject: outbox.subject, text: outbox.text, sentAt: outbox.sentAt })
      .from(outbox)
      .where(eq(outbox.teamId, req.membership!.teamId))
      .orderBy(desc(outbox.id))
      .limit(200);
    res.json(rows.map((m) => ({ ...m, id: String(m.id) })));
  });
}
