/** /api/team: the current team itself, and the registration of its sub-resources (one file each). */
import type { ApiRoutes } from '../api-routes';
import type { AppContext } from '../context';
import { auditRoutes } from './team-audit';
import { invitationLinkRoutes } from './invitation-links';
import { invitationRoutes } from './team-invitations';
import { memberRoutes } from './team-members';
import { outboxRoutes } from './team-outbox';

export function teamRoutes(api: ApiRoutes, ctx: AppContext): void {
  api.get('/team', 'team.read', (req, res) => {
    res.json({ id: req.membership!.teamId, name: req.membership!.teamName });
  });
  memberRoutes(api, ctx);
  invitationRoutes(api, ctx);
  invitationLinkRoutes(api, ctx);
  outboxRoutes(api, ctx);
  auditRoutes(api, ctx);
}
