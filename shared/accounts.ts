/**
 * Account facts the server enforces and the client shows, kept once (imported by both).
 */

/** Team roles, in the order screens list them (permissions per role: server/permissions.ts). */
export const ROLES = ['admin', 'designer', 'reviewer', 'estimator', 'owner'] as const;
export type Role = (typeof ROLES)[number];

/** Shortest password accepted at sign-up and on accepting an invitation. */
export const MIN_PASSWORD_LENGTH = 10;
