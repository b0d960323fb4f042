/**
 * Who may do what: the ONE permission table (server/API.md "Permission names") and the guards
 * every /api route goes through. Roles come from the membership of the session's current team.
 */
import type { RequestHandler } from 'express';
import { ROLES, type Role } from '../shared/accounts';
import { ApiError } from './errors';

export { ROLES, type Role };

const EVERY_MEMBER: readonly Role[] = ROLES;
/**
 * Who designs: the designer, and the admin, who runs the team and can do what a designer can
 * (an admin who creates a project can also draw in it). README "Roles" says the same.
 */
const DESIGNERS: readonly Role[] = ['admin', 'designer'];

/** Permission → roles holding it. */
export const PERMISSION_TABLE = {
  'project.read': EVERY_MEMBER,
  'project.create': DESIGNERS,
  'project.update': DESIGNERS,
  'project.delete': DESIGNERS,
  'network.read': EVERY_MEMBER,
  'network.write': DESIGNERS,
  'budget.read': EVERY_MEMBER,
  'budget.write': DESIGNERS,
  /** The Profile's per-project settings (default cover over pipes). */
  'profile.write': DESIGNERS,
  'review.read': EVERY_MEMBER,
  'review.submit': DESIGNERS,
  'review.decide': ['reviewer'],
  'review.comment': [...DESIGNERS, 'reviewer', 'owner'],
  'files.read': EVERY_MEMBER,
  'files.write': DESIGNERS,
  'prices.read': EVERY_MEMBER,
  /** Only estimators (and admins) keep the team's price list. */
  'prices.write': ['admin', 'estimator'],
  'options.read': EVERY_MEMBER,
  /** Make, edit, size, delete and promote options: the designers. */
  'options.write': DESIGNERS,
  /** Mark the preferred option: the owner (the farmer or client) decides. */
  'options.prefer': ['owner'],
  'takeoff.read': EVERY_MEMBER,
  /** Waste allowance, bend angle, the "other" list, labour, markup and tax. */
  'takeoff.write': ['admin', 'estimator'],
  /** Accept an estimate (recorded): the owner. */
  'estimate.accept': ['owner'],
  'team.read': EVERY_MEMBER,
  'team.manage': ['admin'],
  'outbox.read': ['admin'],
  'audit.read': ['admin'],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof PERMISSION_TABLE;
export const PERMISSIONS = Object.keys(PERMISSION_TABLE) as Permission[];

export function hasPermission(roles: readonly Role[], permission: Permission): boolean {
  const allowed: readonly Role[] = PERMISSION_TABLE[permission];
  return roles.some((r) => allowed.includes(r));
}

/** The permissions a set of roles grants, in table order. */
export function permissionsFor(roles: readonly Role[]): Permission[] {
  return PERMISSIONS.filter((p) => hasPermission(roles, p));
}

/** How a route is reached: a permission in the current team, any signed-in user, or anyone. */
export type Access = Permission | 'signed-in' | 'public';

/** Open to anyone (sign-in, CSRF token, invitation look-up). */
export const publicRoute: RequestHandler = (_req, _res, next) => next();

/** A signed-in user, whatever their team roles. */
export const requireSignedIn: RequestHandler = (req, _res, next) => {
  if (!req.user) return next(new ApiError('unauthenticated', 'Sign in first'));
  next();
};

/** A signed-in member of the current team holding `permission`; sets req.membership. */
export function requirePermission(permission: Permission): RequestHandler {
  return (req, _res, next) => {
    if (!req.user) return next(new ApiError('unauthenticated', 'Sign in first'));
    const membership = req.membership;
    if (!membership) return next(new ApiError('forbidden', 'You are not a member of a team; accept an invitation or create a team'));
    if (!hasPermission(membership.roles, permission)) {
      return next(new ApiError('forbidden', `Your roles (${membership.roles.join(', ')}) do not include permission ${permission}`));
    }
    next();
  };
}

export function guard(access: Access): RequestHandler {
  if (access === 'public') return publicRoute;
  if (access === 'signed-in') return requireSignedIn;
  return requirePermission(access);
}

export function isRole(value: string): value is Role {
  return (ROLES as readonly string[]).includes(value);
}
