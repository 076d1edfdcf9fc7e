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

/** The four workspace roles, as in the product's roles table. */
export const roles = ['admin', 'engineer', 'reviewer', 'regulator'] as const;
export type Role = (typeof roles)[number];

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
