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

/** Raw bytes (PostgreSQL bytea) as a Node Buffer. */
const bytea = customType<{ data: Buffer; driverData: Buffer | Uint8Array }>({
  dataType: () => 'bytea',
  fromDriver: (value) => Buffer.from(value),
});

const createdAt = () => timestamp('created_at', { withTimezone: true }).notNull().defaultNow();

export const users = pgTable(
  'users',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    /** Stored lower-cased. */
    email: text('email').notNull(),
    name: text('name').notNull(),
    passwordHash: text('password_hash').notNull(),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('users_email_idx').on(t.email)],
);

export const teams = pgTable('teams', {
  id: uuid('id').primaryKey().defaultRandom(),
  name: text('name').notNull(),
  createdAt: createdAt(),
});

export const memberships = pgTable(
  'memberships',
  {
    teamId: uuid('team_id')
      .notNull()
      .references(() => teams.id, { onDelete: 'cascade' }),
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
    id: uuid('id').primaryKey().defaultRandom(),
    teamId: uuid('team_id')
      .notNull()
      .references(() => teams.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    siteName: text('site_name').notNull().default(''),
    notes: text('notes').notNull().default(''),
    units: text('units', { enum: ['us', 'si'] })
      .notNull()
      .default('us'),
    archived: boolean('archived').notNull().default(false),
    createdAt: createdAt(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('projects_team_idx').on(t.teamId)],
);

/** express-session rows (server/auth/session-store.ts). */
export const sessions = pgTable(
  'sessions',
  {
    sid: text('sid').primaryKey(),
    data: jsonb('data').notNull(),
    expires: timestamp('expires', { withTimezone: true }).notNull(),
  },
  (t) => [index('sessions_expires_idx').on(t.expires)],
);

/** Sign-in attempt counters (server/auth/rate-limit-store.ts), shared by every server instance. */
export const rateLimits = pgTable('rate_limits', {
  key: text('key').primaryKey(),
  hits: integer('hits').notNull(),
  resetAt: timestamp('reset_at', { withTimezone: true }).notNull(),
});

export const invitations = pgTable(
  'invitations',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    teamId: uuid('team_id')
      .notNull()
      .references(() => teams.id, { onDelete: 'cascade' }),
    email: text('email').notNull(),
    roles: text('roles').array().notNull(),
    /** SHA-256 of the token mailed in the link; the token itself is never stored. */
    tokenHash: text('token_hash').notNull(),
    invitedBy: uuid('invited_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    acceptedAt: timestamp('accepted_at', { withTimezone: true }),
    acceptedBy: uuid('accepted_by').references(() => users.id, { onDelete: 'set null' }),
    /**
     * Admin override, audited when set: any signed-in account may accept (e.g. the person uses
     * another address for Runnel). Without it only an account with `email` may accept.
     */
    anyAccount: boolean('any_account').notNull().default(false),
    /** Withdrawn by an admin: the link no longer works. */
    revokedAt: timestamp('revoked_at', { withTimezone: true }),
  },
  (t) => [uniqueIndex('invitations_token_idx').on(t.tokenHash), index('invitations_team_idx').on(t.teamId)],
);

export const auditLog = pgTable(
  'audit_log',
  {
    id: bigserial('id', { mode: 'number' }).primaryKey(),
    at: timestamp('at', { withTimezone: true }).notNull().defaultNow(),
    teamId: uuid('team_id').references(() => teams.id, { onDelete: 'cascade' }),
    userId: uuid('user_id').references(() => users.id, { onDelete: 'set null' }),
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
  sentAt: timestamp('sent_at', { withTimezone: true }).notNull().defaultNow(),
});

export const networks = pgTable(
  'networks',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    projectId: uuid('project_id')
      .notNull()
      .references(() => projects.id, { onDelete: 'cascade' }),
    /** Incremented on every save; a save must name the version it started from. */
    version: integer('version').notNull(),
    document: jsonb('document').notNull(),
    results: jsonb('results'),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
    updatedBy: uuid('updated_by').references(() => users.id, { onDelete: 'set null' }),
  },
  (t) => [uniqueIndex('networks_project_idx').on(t.projectId)],
);

/** A project's water budget (runnel.budget/1, engine/budget): versioned like the network. */
export const budgets = pgTable(
  'budgets',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    projectId: uuid('project_id')
      .notNull()
      .references(() => projects.id, { onDelete: 'cascade' }),
    /** Incremented on every save; a save must name the version it started from. */
    version: integer('version').notNull(),
    document: jsonb('document').notNull(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
    updatedBy: uuid('updated_by').references(() => users.id, { onDelete: 'set null' }),
  },
  (t) => [uniqueIndex('budgets_project_idx').on(t.projectId)],
);

/** A project's Profile settings (the default cover over pipes without their own, ...): one row per project. */
export const profileSettings = pgTable('profile_settings', {
  projectId: uuid('project_id')
    .primaryKey()
    .references(() => projects.id, { onDelete: 'cascade' }),
  settings: jsonb('settings').notNull(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  updatedBy: uuid('updated_by').references(() => users.id, { onDelete: 'set null' }),
});

export const files = pgTable(
  'files',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    projectId: uuid('project_id')
      .notNull()
      .references(() => projects.id, { onDelete: 'cascade' }),
    kind: text('kind', { enum: ['backdrop', 'survey', 'photo'] }).notNull(),
    filename: text('filename').notNull(),
    mime: text('mime').notNull(),
    size: integer('size').notNull(),
    bytes: bytea('bytes').notNull(),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
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
    id: uuid('id').primaryKey().defaultRandom(),
    projectId: uuid('project_id')
      .notNull()
      .references(() => projects.id, { onDelete: 'cascade' }),
    version: integer('version').notNull(),
    document: jsonb('document').notNull(),
    results: jsonb('results'),
    summary: text('summary').notNull().default(''),
    /** Set when the version was made by restoring an earlier one. */
    restoredFrom: integer('restored_from'),
    createdAt: createdAt(),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    /** Sign-off state: draft → submitted → approved | returned (a returned version may be submitted again). */
    status: text('status', { enum: ['draft', 'submitted', 'approved', 'returned'] })
      .notNull()
      .default('draft'),
    statusAt: timestamp('status_at', { withTimezone: true }),
    statusBy: uuid('status_by').references(() => users.id, { onDelete: 'set null' }),
    /** The note given with the last transition (submit note, return reason, approval remark). */
    statusNote: text('status_note').notNull().default(''),
  },
  (t) => [uniqueIndex('network_versions_project_version_idx').on(t.projectId, t.version)],
);

/** Review comments: threaded (parent), pinned to an element or a plan point, resolvable. */
export const reviewComments = pgTable(
  'review_comments',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    projectId: uuid('project_id')
      .notNull()
      .references(() => projects.id, { onDelete: 'cascade' }),
    /** The version the comment was made on. */
    version: integer('version').notNull(),
    /** A reply's thread root; null for a thread's first comment (which carries the pin). */
    parentId: uuid('parent_id'),
    element: text('element'),
    xM: doublePrecision('x_m'),
    yM: doublePrecision('y_m'),
    body: text('body').notNull(),
    resolved: boolean('resolved').notNull().default(false),
    resolvedAt: timestamp('resolved_at', { withTimezone: true }),
    resolvedBy: uuid('resolved_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
  },
  (t) => [index('review_comments_project_idx').on(t.projectId, t.version)],
);

/** A team's price list: one row per item code (engine/takeoff codes: `pe-sidr9/1"`, `tee/1"`, `other/trenching`). */
export const priceItems = pgTable(
  'price_items',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    teamId: uuid('team_id')
      .notNull()
      .references(() => teams.id, { onDelete: 'cascade' }),
    code: text('code').notNull(),
    description: text('description').notNull().default(''),
    unit: text('unit').notNull().default('each'),
    /** Unit price in the team's currency; null = not priced yet (the takeoff flags it). */
    price: doublePrecision('price'),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
    updatedBy: uuid('updated_by').references(() => users.id, { onDelete: 'set null' }),
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
    id: uuid('id').primaryKey().defaultRandom(),
    projectId: uuid('project_id')
      .notNull()
      .references(() => projects.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    notes: text('notes').notNull().default(''),
    /** The network version the option was made from. */
    baseVersion: integer('base_version').notNull(),
    document: jsonb('document').notNull(),
    /** The last sizing report (engine SizingResult without its document), null until sized. */
    sizing: jsonb('sizing'),
    createdAt: createdAt(),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
    updatedBy: uuid('updated_by').references(() => users.id, { onDelete: 'set null' }),
    preferred: boolean('preferred').notNull().default(false),
    preferredAt: timestamp('preferred_at', { withTimezone: true }),
    preferredBy: uuid('preferred_by').references(() => users.id, { onDelete: 'set null' }),
    /** Network version created when the option was promoted to be the design. */
    promotedVersion: integer('promoted_version'),
    promotedAt: timestamp('promoted_at', { withTimezone: true }),
    promotedBy: uuid('promoted_by').references(() => users.id, { onDelete: 'set null' }),
  },
  (t) => [index('design_options_project_idx').on(t.projectId)],
);

/** The estimator's takeoff and estimate settings of a project (waste, bend angle, other list, labour, markup, tax). */
export const takeoffSettings = pgTable('takeoff_settings', {
  projectId: uuid('project_id')
    .primaryKey()
    .references(() => projects.id, { onDelete: 'cascade' }),
  settings: jsonb('settings').notNull(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  updatedBy: uuid('updated_by').references(() => users.id, { onDelete: 'set null' }),
});

/** An owner's acceptance of an estimate: what was accepted (a snapshot), for which design, who and when. */
export const estimateAcceptances = pgTable(
  'estimate_acceptances',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    projectId: uuid('project_id')
      .notNull()
      .references(() => projects.id, { onDelete: 'cascade' }),
    networkVersion: integer('network_version').notNull(),
    optionId: uuid('option_id').references(() => designOptions.id, { onDelete: 'set null' }),
    total: doublePrecision('total').notNull(),
    currency: text('currency').notNull().default('USD'),
    estimate: jsonb('estimate').notNull(),
    acceptedAt: createdAt(),
    acceptedBy: uuid('accepted_by').references(() => users.id, { onDelete: 'set null' }),
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
    projectId: uuid('project_id')
      .notNull()
      .references(() => projects.id, { onDelete: 'cascade' }),
    id: uuid('id').notNull(),
    walkId: uuid('walk_id').notNull(),
    type: text('type', { enum: ['point', 'track'] }).notNull(),
    recordedAt: timestamp('recorded_at', { withTimezone: true }).notNull(),
    /** lat, lon, elevation_m, elevation_source, accuracy_m, label, kind, note, photo_id, poor_fix. */
    data: jsonb('data').notNull(),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.projectId, t.id] }), index('walk_points_walk_idx').on(t.projectId, t.walkId)],
);
