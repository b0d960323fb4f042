/**
 * The Drizzle schema: the single source of truth for Runnel's database.
 * Migrations in drizzle/migrations are generated from this file with `npx drizzle-kit generate`.
 */
import { sql } from 'drizzle-orm';
import {
  bigserial,
  boolean,
  customType,
  doublePrecision,
  index,
  integer,
  jsonb,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core';
import { VERSION_STATUSES } from '../shared/versions-api';

/** Raw bytes (PostgreSQL bytea) as a Node Buffer. */
const bytea = customType<{ data: Buffer; driverData: Buffer | Uint8Array }>({
  dataType: () => 'bytea',
  fromDriver: (value) => Buffer.from(value),
});

// Column helpers: the blocks every table repeats, written once (the SQL they make is unchanged).
/** A time column (always with time zone). */
const at = (name: string) => timestamp(name, { withTimezone: true });
const createdAt = () => at('created_at').notNull().defaultNow();
const updatedAt = () => at('updated_at').notNull().defaultNow();
/** A random uuid primary key. */
const id = () => uuid('id').primaryKey().defaultRandom();
/** Who did something; the row stays (with null) when the account is deleted. */
const byUser = (name: string) => uuid(name).references(() => users.id, { onDelete: 'set null' });
/** The owning team or project: the row goes with it. */
const teamId = () =>
  uuid('team_id')
    .notNull()
    .references(() => teams.id, { onDelete: 'cascade' });
const projectId = () =>
  uuid('project_id')
    .notNull()
    .references(() => projects.id, { onDelete: 'cascade' });
/** When and by whom a row was made / last saved. */
const created = () => ({ createdAt: createdAt(), createdBy: byUser('created_by') });
const lastSaved = () => ({ updatedAt: updatedAt(), updatedBy: byUser('updated_by') });
/** A project's one document saved whole, version-checked on every save (network, budget). */
const versionedDocument = () => ({
  id: id(),
  projectId: projectId(),
  /** Incremented on every save; a save must name the version it started from. */
  version: integer('version').notNull(),
  document: jsonb('document').notNull(),
});
/** A project's settings record (one row per project, replaced whole). */
const projectSettings = () => ({
  projectId: uuid('project_id')
    .primaryKey()
    .references(() => projects.id, { onDelete: 'cascade' }),
  settings: jsonb('settings').notNull(),
  ...lastSaved(),
});

export const users = pgTable(
  'users',
  {
    id: id(),
    /** Stored lower-cased. */
    email: text('email').notNull(),
    name: text('name').notNull(),
    passwordHash: text('password_hash').notNull(),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('users_email_idx').on(t.email)],
);

export const teams = pgTable('teams', {
  id: id(),
  name: text('name').notNull(),
  createdAt: createdAt(),
});

export const memberships = pgTable(
  'memberships',
  {
    teamId: teamId(),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    /** Role names (server/permissions.ts ROLES); at least one. */
    roles: text('roles').array().notNull(),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.teamId, t.userId] }), index('memberships_user_idx').on(t.userId)],
);

export const projects = pgTable(
  'projects',
  {
    id: id(),
    teamId: teamId(),
    name: text('name').notNull(),
    siteName: text('site_name').notNull().default(''),
    notes: text('notes').notNull().default(''),
    units: text('units', { enum: ['us', 'si'] })
      .notNull()
      .default('us'),
    archived: boolean('archived').notNull().default(false),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index('projects_team_idx').on(t.teamId)],
);

/** express-session rows (server/auth/session-store.ts). */
export const sessions = pgTable(
  'sessions',
  {
    sid: text('sid').primaryKey(),
    data: jsonb('data').notNull(),
    expires: at('expires').notNull(),
  },
  (t) => [index('sessions_expires_idx').on(t.expires)],
);

/** Sign-in attempt counters (server/auth/rate-limit-store.ts), shared by every server instance. */
export const rateLimits = pgTable('rate_limits', {
  key: text('key').primaryKey(),
  hits: integer('hits').notNull(),
  resetAt: at('reset_at').notNull(),
});

export const invitations = pgTable(
  'invitations',
  {
    id: id(),
    teamId: teamId(),
    email: text('email').notNull(),
    roles: text('roles').array().notNull(),
    /** SHA-256 of the token mailed in the link; the token itself is never stored. */
    tokenHash: text('token_hash').notNull(),
    invitedBy: byUser('invited_by'),
    createdAt: createdAt(),
    expiresAt: at('expires_at').notNull(),
    acceptedAt: at('accepted_at'),
    acceptedBy: byUser('accepted_by'),
    /**
     * Admin override, audited when set: any signed-in account may accept (e.g. the person uses
     * another address for Runnel). Without it only an account with `email` may accept.
     */
    anyAccount: boolean('any_account').notNull().default(false),
    /** Withdrawn by an admin: the link no longer works. */
    revokedAt: at('revoked_at'),
  },
  (t) => [uniqueIndex('invitations_token_idx').on(t.tokenHash), index('invitations_team_idx').on(t.teamId)],
);

export const auditLog = pgTable(
  'audit_log',
  {
    id: bigserial('id', { mode: 'number' }).primaryKey(),
    at: at('at').notNull().defaultNow(),
    teamId: uuid('team_id').references(() => teams.id, { onDelete: 'cascade' }),
    userId: byUser('user_id'),
    /** Copied so the entry stays readable after the user is gone. */
    userEmail: text('user_email'),
    action: text('action').notNull(),
    target: text('target').notNull().default(''),
    detail: jsonb('detail')
      .notNull()
      .default(sql`'{}'::jsonb`),
  },
  (t) => [index('audit_team_at_idx').on(t.teamId, t.at)],
);

/** Mail captured by the development/test SMTP sink (server/mail/sink.ts). */
export const outbox = pgTable('outbox', {
  id: bigserial('id', { mode: 'number' }).primaryKey(),
  /** From the X-Runnel-Team header, so a team's admin sees only that team's mail. */
  teamId: uuid('team_id').references(() => teams.id, { onDelete: 'cascade' }),
  from: text('from').notNull().default(''),
  to: text('to').notNull(),
  subject: text('subject').notNull().default(''),
  text: text('text').notNull().default(''),
  raw: text('raw').notNull(),
  sentAt: at('sent_at').notNull().defaultNow(),
});

export const networks = pgTable(
  'networks',
  {
    ...versionedDocument(),
    results: jsonb('results'),
    ...lastSaved(),
  },
  (t) => [uniqueIndex('networks_project_idx').on(t.projectId)],
);

/** A project's water budget (runnel.budget/1, engine/budget): versioned like the network. */
export const budgets = pgTable(
  'budgets',
  {
    ...versionedDocument(),
    ...lastSaved(),
  },
  (t) => [uniqueIndex('budgets_project_idx').on(t.projectId)],
);

/** A project's Profile settings (the default cover over pipes without their own, ...): one row per project. */
export const profileSettings = pgTable('profile_settings', projectSettings());

export const files = pgTable(
  'files',
  {
    id: id(),
    projectId: projectId(),
    kind: text('kind', { enum: ['backdrop', 'survey', 'photo'] }).notNull(),
    filename: text('filename').notNull(),
    mime: text('mime').notNull(),
    size: integer('size').notNull(),
    bytes: bytea('bytes').notNull(),
    // created_by before created_at, as the table was first made
    createdBy: byUser('created_by'),
    createdAt: createdAt(),
  },
  (t) => [index('files_project_idx').on(t.projectId)],
);

/**
 * Every save of a network keeps an immutable copy here (who, when, a one-line summary of the change)
 * and its sign-off state (server/network/versions-store.ts, server/review/). Rows are never updated
 * except for the sign-off columns, and an approved row never changes again.
 */
export const networkVersions = pgTable(
  'network_versions',
  {
    id: id(),
    projectId: projectId(),
    version: integer('version').notNull(),
    document: jsonb('document').notNull(),
    results: jsonb('results'),
    summary: text('summary').notNull().default(''),
    /** Set when the version was made by restoring an earlier one. */
    restoredFrom: integer('restored_from'),
    ...created(),
    /** Sign-off state: draft → submitted → approved | returned (a returned version may be submitted again). */
    status: text('status', { enum: VERSION_STATUSES }).notNull().default('draft'),
    statusAt: at('status_at'),
    statusBy: byUser('status_by'),
    /** The note given with the last transition (submit note, return reason, approval remark). */
    statusNote: text('status_note').notNull().default(''),
  },
  (t) => [uniqueIndex('network_versions_project_version_idx').on(t.projectId, t.version)],
);

/** Review comments: threaded (parent), pinned to an element or a plan point, resolvable. */
export const reviewComments = pgTable(
  'review_comments',
  {
    id: id(),
    projectId: projectId(),
    /** The version the comment was made on. */
    version: integer('version').notNull(),
    /** A reply's thread root; null for a thread's first comment (which carries the pin). */
    parentId: uuid('parent_id'),
    element: text('element'),
    xM: doublePrecision('x_m'),
    yM: doublePrecision('y_m'),
    body: text('body').notNull(),
    resolved: boolean('resolved').notNull().default(false),
    resolvedAt: at('resolved_at'),
    resolvedBy: byUser('resolved_by'),
    ...created(),
  },
  (t) => [index('review_comments_project_idx').on(t.projectId, t.version)],
);

/** A team's price list: one row per item code (engine/takeoff codes: `pe-sidr9/1"`, `tee/1"`, `other/trenching`). */
export const priceItems = pgTable(
  'price_items',
  {
    id: id(),
    teamId: teamId(),
    code: text('code').notNull(),
    description: text('description').notNull().default(''),
    unit: text('unit').notNull().default('each'),
    /** Unit price in the team's currency; null = not priced yet (the takeoff flags it). */
    price: doublePrecision('price'),
    ...lastSaved(),
  },
  (t) => [uniqueIndex('price_items_team_code_idx').on(t.teamId, t.code)],
);

/**
 * A named variant of a project's design (pipe sizes, classes or materials changed, a tank moved),
 * made from a saved network version. Designers edit and promote; the owner marks one preferred.
 */
export const designOptions = pgTable(
  'design_options',
  {
    id: id(),
    projectId: projectId(),
    name: text('name').notNull(),
    notes: text('notes').notNull().default(''),
    /** The network version the option was made from. */
    baseVersion: integer('base_version').notNull(),
    document: jsonb('document').notNull(),
    /** The last sizing report (engine SizingResult without its document), null until sized. */
    sizing: jsonb('sizing'),
    ...created(),
    ...lastSaved(),
    preferred: boolean('preferred').notNull().default(false),
    preferredAt: at('preferred_at'),
    preferredBy: byUser('preferred_by'),
    /** Network version created when the option was promoted to be the design. */
    promotedVersion: integer('promoted_version'),
    promotedAt: at('promoted_at'),
    promotedBy: byUser('promoted_by'),
  },
  (t) => [index('design_options_project_idx').on(t.projectId)],
);

/** The estimator's takeoff and estimate settings of a project (waste, bend angle, other list, labour, markup, tax). */
export const takeoffSettings = pgTable('takeoff_settings', projectSettings());

/** An owner's acceptance of an estimate: what was accepted (a snapshot), for which design, who and when. */
export const estimateAcceptances = pgTable(
  'estimate_acceptances',
  {
    id: id(),
    projectId: projectId(),
    networkVersion: integer('network_version').notNull(),
    optionId: uuid('option_id').references(() => designOptions.id, { onDelete: 'set null' }),
    total: doublePrecision('total').notNull(),
    currency: text('currency').notNull().default('USD'),
    estimate: jsonb('estimate').notNull(),
    acceptedAt: createdAt(),
    acceptedBy: byUser('accepted_by'),
  },
  (t) => [index('estimate_acceptances_project_idx').on(t.projectId)],
);

/**
 * What a phone recorded on a walk (points and track fixes), keyed by the id the phone generated,
 * so a retried sync inserts nothing twice and two phones never overwrite each other.
 * The walk's survey file (files row with id = walk_id) is rebuilt from these rows on every sync.
 */
export const walkPoints = pgTable(
  'walk_points',
  {
    projectId: projectId(),
    id: uuid('id').notNull(),
    walkId: uuid('walk_id').notNull(),
    type: text('type', { enum: ['point', 'track'] }).notNull(),
    recordedAt: at('recorded_at').notNull(),
    /** lat, lon, elevation_m, elevation_source, accuracy_m, label, kind, note, photo_id, poor_fix. */
    data: jsonb('data').notNull(),
    // created_by before created_at, as the table was first made
    createdBy: byUser('created_by'),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.projectId, t.id] }), index('walk_points_walk_idx').on(t.projectId, t.walkId)],
);
