/**
 * The database schema (MariaDB, Drizzle's MySQL dialect): the one module the row types come from.
 *
 * Conventions: ids are auto-increment integers; times are UTC `datetime(3)` columns mapped to `Date`;
 * secrets (password hashes, token hashes) are never stored in clear; audit events are append-only
 * (the database refuses UPDATE and DELETE on them through triggers, see the custom migration).
 */
import {
  datetime,
  index,
  int,
  json,
  mysqlEnum,
  mysqlTable,
  uniqueIndex,
  varchar,
  bigint,
  char,
} from 'drizzle-orm/mysql-core';
import { sql } from 'drizzle-orm';

import { roles } from '@/lib/auth/roles';

export { roles, type Role } from '@/lib/auth/roles';

const createdAt = () =>
  datetime('created_at', { mode: 'date', fsp: 3 })
    .notNull()
    .default(sql`CURRENT_TIMESTAMP(3)`);
const updatedAt = () =>
  datetime('updated_at', { mode: 'date', fsp: 3 })
    .notNull()
    .default(sql`CURRENT_TIMESTAMP(3)`)
    .$onUpdate(() => new Date());

/** Auto-increment BIGINT UNSIGNED primary key (not `serial`: MariaDB rejects drizzle's `serial AUTO_INCREMENT`). */
const idColumn = () => bigint('id', { mode: 'number', unsigned: true }).autoincrement().primaryKey();
/** A foreign key to an auto-increment id. */
const idRef = (name: string) => bigint(name, { mode: 'number', unsigned: true });

export const users = mysqlTable(
  'users',
  {
    id: idColumn(),
    /** Stored lower-cased and trimmed; unique across the installation. */
    email: varchar('email', { length: 254 }).notNull(),
    name: varchar('name', { length: 120 }).notNull(),
    /** bcrypt hash ("$2b$..."), 60 characters. */
    passwordHash: varchar('password_hash', { length: 72 }).notNull(),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [uniqueIndex('users_email_unique').on(t.email)],
);

export const workspaces = mysqlTable(
  'workspaces',
  {
    id: idColumn(),
    name: varchar('name', { length: 120 }).notNull(),
    /** Stable identifier used by seeds and URLs. */
    slug: varchar('slug', { length: 64 }).notNull(),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [uniqueIndex('workspaces_slug_unique').on(t.slug)],
);

export const memberships = mysqlTable(
  'memberships',
  {
    id: idColumn(),
    userId: idRef('user_id')
      .notNull()
      .references(() => users.id),
    workspaceId: idRef('workspace_id')
      .notNull()
      .references(() => workspaces.id),
    role: mysqlEnum('role', roles).notNull(),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [
    uniqueIndex('memberships_user_workspace_unique').on(t.userId, t.workspaceId),
    index('memberships_workspace_idx').on(t.workspaceId),
  ],
);

export const invitations = mysqlTable(
  'invitations',
  {
    id: idColumn(),
    /** SHA-256 of the e-mailed token, hex; the token itself is never stored. */
    tokenHash: char('token_hash', { length: 64 }).notNull(),
    email: varchar('email', { length: 254 }).notNull(),
    role: mysqlEnum('role', roles).notNull(),
    workspaceId: idRef('workspace_id')
      .notNull()
      .references(() => workspaces.id),
    invitedByUserId: idRef('invited_by_user_id')
      .notNull()
      .references(() => users.id),
    expiresAt: datetime('expires_at', { mode: 'date', fsp: 3 }).notNull(),
    usedAt: datetime('used_at', { mode: 'date', fsp: 3 }),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex('invitations_token_hash_unique').on(t.tokenHash),
    index('invitations_workspace_idx').on(t.workspaceId),
  ],
);

export const passwordResetTokens = mysqlTable(
  'password_reset_tokens',
  {
    id: idColumn(),
    /** SHA-256 of the e-mailed token, hex. */
    tokenHash: char('token_hash', { length: 64 }).notNull(),
    userId: idRef('user_id')
      .notNull()
      .references(() => users.id),
    expiresAt: datetime('expires_at', { mode: 'date', fsp: 3 }).notNull(),
    usedAt: datetime('used_at', { mode: 'date', fsp: 3 }),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex('password_reset_tokens_token_hash_unique').on(t.tokenHash),
    index('password_reset_tokens_user_idx').on(t.userId),
  ],
);

/**
 * Failed sign-in counters, one row per key ("account:<e-mail>" or "ip:<address>"), shared by every
 * app instance. A window starts at the first failure; the row is reset when the window has passed.
 */
export const signInCounters = mysqlTable('sign_in_counters', {
  key: varchar('key', { length: 300 }).primaryKey(),
  failures: int('failures').notNull(),
  windowStartedAt: datetime('window_started_at', { mode: 'date', fsp: 3 }).notNull(),
  lastFailureAt: datetime('last_failure_at', { mode: 'date', fsp: 3 }).notNull(),
});

/** Append-only trail of every change: who, when, what, before and after. */
export const auditEvents = mysqlTable(
  'audit_events',
  {
    id: idColumn(),
    /** Null only for events outside any workspace. */
    workspaceId: idRef('workspace_id').references(() => workspaces.id),
    /** Null when no signed-in user acted (e.g. a password reset by e-mailed link is attributed to the account). */
    actorUserId: idRef('actor_user_id').references(() => users.id),
    at: datetime('at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
    /** Dotted verb, e.g. "membership.role-changed". */
    action: varchar('action', { length: 80 }).notNull(),
    entityType: varchar('entity_type', { length: 60 }).notNull(),
    entityId: varchar('entity_id', { length: 64 }).notNull(),
    before: json('before'),
    after: json('after'),
  },
  (t) => [
    index('audit_events_workspace_at_idx').on(t.workspaceId, t.at),
    index('audit_events_entity_idx').on(t.entityType, t.entityId),
  ],
);

export type User = typeof users.$inferSelect;
export type Workspace = typeof workspaces.$inferSelect;
export type Membership = typeof memberships.$inferSelect;
export type Invitation = typeof invitations.$inferSelect;
export type PasswordResetToken = typeof passwordResetTokens.$inferSelect;
export type AuditEvent = typeof auditEvents.$inferSelect;
export type NewAuditEvent = typeof auditEvents.$inferInsert;

// ───────────────────────────────────────────────────────────────────────────────────────────────
// Programs, channel plans and the part library (workspace data).
// Every row carries its workspace so that each query can be scoped by it: an id from another
// workspace simply matches nothing.
// ───────────────────────────────────────────────────────────────────────────────────────────────
// (Imports for this section are kept here so the section above stays as its author wrote it;
// ES imports are hoisted, so their position does not matter.)
import { customType } from 'drizzle-orm/mysql-core';
import { partKinds, partStatuses } from '@/lib/parts/part-kinds';

/**
 * A JSON document column. MariaDB's JSON type is LONGTEXT with a validity check, so the driver
 * returns it as a string: parse it on the way out (drizzle's `json()` does not).
 */
const jsonDocument = <TData>(name: string) =>
  customType<{ data: TData; driverData: string }>({
    dataType: () => 'json',
    toDriver: (value) => JSON.stringify(value),
    fromDriver: (value) => (typeof value === 'string' ? (JSON.parse(value) as TData) : (value as TData)),
  })(name);

/** A device under development; holds channel plans. */
export const programs = mysqlTable(
  'programs',
  {
    id: idColumn(),
    workspaceId: idRef('workspace_id')
      .notNull()
      .references(() => workspaces.id),
    name: varchar('name', { length: 200 }).notNull(),
    description: varchar('description', { length: 2000 }).notNull().default(''),
    /** Set when archived; archived programs are hidden from the default list and read-only. */
    archivedAt: datetime('archived_at', { mode: 'date', fsp: 3 }),
    createdByUserId: idRef('created_by_user_id')
      .notNull()
      .references(() => users.id),
    updatedByUserId: idRef('updated_by_user_id')
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index('programs_workspace_idx').on(t.workspaceId, t.archivedAt)],
);

/**
 * One acquisition channel design (the draft that revisions snapshot). `plan` is the engine's input
 * (validated by `parsePlan` before every write); `report` is what the server computed from it.
 * `version` implements optimistic concurrency: a save names the version it was based on.
 */
export const channelPlans = mysqlTable(
  'channel_plans',
  {
    id: idColumn(),
    programId: idRef('program_id')
      .notNull()
      .references(() => programs.id),
    workspaceId: idRef('workspace_id')
      .notNull()
      .references(() => workspaces.id),
    name: varchar('name', { length: 200 }).notNull(),
    /** Requirement profile id of the plan (`diagnostic-ecg`, ..., `custom`), copied from the plan for listing. */
    profileId: varchar('profile_id', { length: 100 }).notNull(),
    /** Application of the profile: ecg, emg or eeg. */
    application: varchar('application', { length: 10 }).notNull(),
    plan: jsonDocument<Record<string, unknown>>('plan').notNull(),
    /** The server's report for `plan` (null only if the engine could not produce one). */
    report: jsonDocument<unknown>('report'),
    /** Worst verdict among the report's checks, kept beside it so plan lists need not read reports. */
    worstVerdict: mysqlEnum('worst_verdict', ['meets', 'marginal', 'fails']),
    version: int('version').notNull().default(1),
    archivedAt: datetime('archived_at', { mode: 'date', fsp: 3 }),
    createdByUserId: idRef('created_by_user_id')
      .notNull()
      .references(() => users.id),
    updatedByUserId: idRef('updated_by_user_id')
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [
    index('channel_plans_program_idx').on(t.programId),
    index('channel_plans_workspace_idx').on(t.workspaceId),
  ],
);

/**
 * A part-library entry. `values` holds the part's parameters keyed by the channel plan's field
 * names (`enVPerRtHz`, `gbwHz`, `bits`, `rsOhm`, ...), SI units, as validated by lib/parts.
 */
export const parts = mysqlTable(
  'parts',
  {
    id: idColumn(),
    workspaceId: idRef('workspace_id')
      .notNull()
      .references(() => workspaces.id),
    kind: mysqlEnum('kind', partKinds).notNull(),
    name: varchar('name', { length: 120 }).notNull(),
    description: varchar('description', { length: 500 }).notNull().default(''),
    status: mysqlEnum('status', partStatuses).notNull(),
    /** Where the values come from: datasheet revision, measured, or assumed. */
    sourceNote: varchar('source_note', { length: 500 }).notNull(),
    values: jsonDocument<Record<string, number | string>>('values').notNull(),
    retiredAt: datetime('retired_at', { mode: 'date', fsp: 3 }),
    createdByUserId: idRef('created_by_user_id')
      .notNull()
      .references(() => users.id),
    updatedByUserId: idRef('updated_by_user_id')
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [uniqueIndex('parts_workspace_kind_name_unique').on(t.workspaceId, t.kind, t.name)],
);

export type Program = typeof programs.$inferSelect;
export type ChannelPlanRow = typeof channelPlans.$inferSelect;
export type PartRow = typeof parts.$inferSelect;
