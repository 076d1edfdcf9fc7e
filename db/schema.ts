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

// ───────────────────────────────────────────────────────────────────────────────────────────────
// Revisions and design reviews.
// A revision's content (plan, report, hash, label, summary, author) is frozen when it is created:
// the custom migration installs triggers that refuse any UPDATE of those columns and any DELETE.
// Only `state` / `state_changed_at` may move, along the allowed transitions, and every move is
// appended to `revision_state_events` (append-only, like signatures and reviewer lists).
// ───────────────────────────────────────────────────────────────────────────────────────────────
import { text } from 'drizzle-orm/mysql-core';

/** Revision states: draft → in-review → released | changes-requested; released → superseded. */
export const revisionStateValues = ['draft', 'in-review', 'released', 'changes-requested', 'superseded'] as const;
/** What a signature means. */
export const signatureMeaningValues = ['approved', 'changes-requested'] as const;
/** Review request lifecycle. */
export const reviewStatusValues = ['open', 'approved', 'changes-requested', 'closed'] as const;
/** What a review comment is anchored to. */
export const commentAnchorKindValues = ['stage', 'check'] as const;

/** An immutable snapshot of a channel plan with its server-computed report. */
export const planRevisions = mysqlTable(
  'plan_revisions',
  {
    id: idColumn(),
    workspaceId: idRef('workspace_id')
      .notNull()
      .references(() => workspaces.id),
    planId: idRef('plan_id')
      .notNull()
      .references(() => channelPlans.id),
    /** 1, 2, 3, ... per plan; the label is derived from it (1 → A, 27 → AA). */
    sequence: int('sequence').notNull(),
    label: varchar('label', { length: 3 }).notNull(),
    changeSummary: varchar('change_summary', { length: 4000 }).notNull(),
    /** The plan's version number the revision was frozen from. */
    planVersion: int('plan_version').notNull(),
    plan: jsonDocument<Record<string, unknown>>('plan').notNull(),
    report: jsonDocument<unknown>('report').notNull(),
    /** SHA-256 of the canonical JSON of { plan, report }, 64 lowercase hex digits. */
    contentHash: char('content_hash', { length: 64 }).notNull(),
    worstVerdict: mysqlEnum('worst_verdict', ['meets', 'marginal', 'fails']),
    createdByUserId: idRef('created_by_user_id')
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
    /** The only mutable columns (the trigger checks the transition). */
    state: mysqlEnum('state', revisionStateValues).notNull().default('draft'),
    stateChangedAt: datetime('state_changed_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [
    uniqueIndex('plan_revisions_plan_sequence_unique').on(t.planId, t.sequence),
    uniqueIndex('plan_revisions_plan_label_unique').on(t.planId, t.label),
    index('plan_revisions_workspace_state_idx').on(t.workspaceId, t.state),
  ],
);

/** Append-only history of a revision's state. */
export const revisionStateEvents = mysqlTable(
  'revision_state_events',
  {
    id: idColumn(),
    workspaceId: idRef('workspace_id')
      .notNull()
      .references(() => workspaces.id),
    revisionId: idRef('revision_id')
      .notNull()
      .references(() => planRevisions.id),
    /** Null for the creation of the revision. */
    fromState: mysqlEnum('from_state', revisionStateValues),
    toState: mysqlEnum('to_state', revisionStateValues).notNull(),
    actorUserId: idRef('actor_user_id').references(() => users.id),
    at: datetime('at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
    reason: varchar('reason', { length: 500 }).notNull().default(''),
  },
  (t) => [index('revision_state_events_revision_idx').on(t.revisionId)],
);

/** A request for review of one revision, sent to chosen reviewers. */
export const reviewRequests = mysqlTable(
  'review_requests',
  {
    id: idColumn(),
    workspaceId: idRef('workspace_id')
      .notNull()
      .references(() => workspaces.id),
    revisionId: idRef('revision_id')
      .notNull()
      .references(() => planRevisions.id),
    requestedByUserId: idRef('requested_by_user_id')
      .notNull()
      .references(() => users.id),
    message: varchar('message', { length: 2000 }).notNull().default(''),
    status: mysqlEnum('status', reviewStatusValues).notNull().default('open'),
    requestedAt: datetime('requested_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
    closedAt: datetime('closed_at', { mode: 'date', fsp: 3 }),
  },
  (t) => [index('review_requests_revision_idx').on(t.revisionId)],
);

/** The reviewers a request names (append-only); every one of them must approve. */
export const reviewRequestReviewers = mysqlTable(
  'review_request_reviewers',
  {
    id: idColumn(),
    reviewRequestId: idRef('review_request_id')
      .notNull()
      .references(() => reviewRequests.id),
    reviewerUserId: idRef('reviewer_user_id')
      .notNull()
      .references(() => users.id),
  },
  (t) => [uniqueIndex('review_request_reviewers_unique').on(t.reviewRequestId, t.reviewerUserId)],
);

/** A comment on a revision, anchored to a stage or a check; replies name their parent. */
export const reviewComments = mysqlTable(
  'review_comments',
  {
    id: idColumn(),
    workspaceId: idRef('workspace_id')
      .notNull()
      .references(() => workspaces.id),
    revisionId: idRef('revision_id')
      .notNull()
      .references(() => planRevisions.id),
    parentCommentId: idRef('parent_comment_id'),
    authorUserId: idRef('author_user_id')
      .notNull()
      .references(() => users.id),
    anchorKind: mysqlEnum('anchor_kind', commentAnchorKindValues).notNull(),
    anchorId: varchar('anchor_id', { length: 100 }).notNull(),
    body: text('body').notNull(),
    createdAt: createdAt(),
    /** Resolution is the only change a comment allows (trigger-enforced). */
    resolvedAt: datetime('resolved_at', { mode: 'date', fsp: 3 }),
    resolvedByUserId: idRef('resolved_by_user_id').references(() => users.id),
  },
  (t) => [index('review_comments_revision_idx').on(t.revisionId)],
);

/** A reviewer's decision, signed by re-entering the password; append-only. */
export const reviewSignatures = mysqlTable(
  'review_signatures',
  {
    id: idColumn(),
    workspaceId: idRef('workspace_id')
      .notNull()
      .references(() => workspaces.id),
    revisionId: idRef('revision_id')
      .notNull()
      .references(() => planRevisions.id),
    reviewRequestId: idRef('review_request_id')
      .notNull()
      .references(() => reviewRequests.id),
    signerUserId: idRef('signer_user_id')
      .notNull()
      .references(() => users.id),
    /** The signer's workspace role when signing. */
    signerRole: mysqlEnum('signer_role', roles).notNull(),
    meaning: mysqlEnum('meaning', signatureMeaningValues).notNull(),
    /** The content hash of the revision the signer saw. */
    contentHash: char('content_hash', { length: 64 }).notNull(),
    note: varchar('note', { length: 2000 }).notNull().default(''),
    signedAt: datetime('signed_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [uniqueIndex('review_signatures_request_signer_unique').on(t.reviewRequestId, t.signerUserId)],
);

export type PlanRevisionRow = typeof planRevisions.$inferSelect;
export type RevisionStateEventRow = typeof revisionStateEvents.$inferSelect;
export type ReviewRequestRow = typeof reviewRequests.$inferSelect;
export type ReviewCommentRow = typeof reviewComments.$inferSelect;
export type ReviewSignatureRow = typeof reviewSignatures.$inferSelect;

// ───────────────────────────────────────────────────────────────────────────────────────────────
// Part-library import mappings and bench records.
// A bench record's file is kept in the database (split into MEDIUMBLOB chunks of at most 4 MiB, so
// that a 20 MB upload stays below the server's max_allowed_packet), so every app instance reads
// the same bytes and nothing lives on a local disk. Records are never deleted: a record can only be
// withdrawn (flag, time, reason), and the custom migration refuses DELETE on both tables.
// ───────────────────────────────────────────────────────────────────────────────────────────────
import { double } from 'drizzle-orm/mysql-core';

/** Raw bytes in a MEDIUMBLOB (up to 16 MiB per value), as a Buffer. */
const mediumBlob = (name: string) =>
  customType<{ data: Buffer; driverData: Buffer }>({
    dataType: () => 'mediumblob',
    toDriver: (value) => value,
    fromDriver: (value) => (Buffer.isBuffer(value) ? value : Buffer.from(value as Uint8Array)),
  })(name);

/**
 * The CSV column → part field mapping last used for an import, per workspace and part kind, so the
 * next import of a file with the same headers starts from it.
 */
export const partImportMappings = mysqlTable(
  'part_import_mappings',
  {
    id: idColumn(),
    workspaceId: idRef('workspace_id')
      .notNull()
      .references(() => workspaces.id),
    kind: mysqlEnum('kind', partKinds).notNull(),
    /** Column header → part field (null: the column is ignored). */
    mapping: jsonDocument<Record<string, string | null>>('mapping').notNull(),
    updatedByUserId: idRef('updated_by_user_id')
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [uniqueIndex('part_import_mappings_workspace_kind_unique').on(t.workspaceId, t.kind)],
);

/** Formats a bench record can have (told apart by content). */
export const benchRecordFormatValues = ['edf', 'csv'] as const;
/** Units a CSV bench record may be written in (EDF files carry their own). */
export const benchRecordUnitValues = ['V', 'mV', 'uV'] as const;
/** Whether the recorded values are already referred to the input, or still carry a gain to divide by. */
export const benchGainModeValues = ['referred-to-input', 'gain-to-apply'] as const;

/** A recording from a prototype, attached to a revision, with the settings it was analysed with. */
export const benchRecords = mysqlTable(
  'bench_records',
  {
    id: idColumn(),
    workspaceId: idRef('workspace_id')
      .notNull()
      .references(() => workspaces.id),
    planId: idRef('plan_id')
      .notNull()
      .references(() => channelPlans.id),
    revisionId: idRef('revision_id')
      .notNull()
      .references(() => planRevisions.id),
    fileName: varchar('file_name', { length: 255 }).notNull(),
    format: mysqlEnum('format', benchRecordFormatValues).notNull(),
    byteLength: int('byte_length').notNull(),
    /** SHA-256 of the file, 64 lowercase hex digits. */
    sha256: char('sha256', { length: 64 }).notNull(),
    chunkCount: int('chunk_count').notNull(),
    /** Label of the analysed signal (EDF signal label or CSV column header). */
    channel: varchar('channel', { length: 120 }).notNull(),
    /** Unit of the CSV values; null for EDF (the file states its physical dimension). */
    unit: mysqlEnum('unit', benchRecordUnitValues),
    /** CSV without a time column: the sample rate given, Hz. */
    sampleRateGivenHz: double('sample_rate_given_hz'),
    gainMode: mysqlEnum('gain_mode', benchGainModeValues).notNull(),
    /** Gain from the channel input to the recorded values, V/V (1 when referred to input). */
    gainVPerV: double('gain_v_per_v').notNull(),
    note: varchar('note', { length: 500 }).notNull().default(''),
    /** The measurements (no spectrum) and the comparison with the revision's prediction, at upload. */
    analysis: jsonDocument<Record<string, unknown>>('analysis').notNull(),
    comparison: jsonDocument<unknown[]>('comparison').notNull(),
    withdrawnAt: datetime('withdrawn_at', { mode: 'date', fsp: 3 }),
    withdrawnByUserId: idRef('withdrawn_by_user_id').references(() => users.id),
    withdrawnReason: varchar('withdrawn_reason', { length: 500 }),
    createdByUserId: idRef('created_by_user_id')
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [
    index('bench_records_revision_idx').on(t.revisionId),
    index('bench_records_workspace_plan_idx').on(t.workspaceId, t.planId),
  ],
);

/** The bytes of a bench record's file, in order. */
export const benchRecordChunks = mysqlTable(
  'bench_record_chunks',
  {
    id: idColumn(),
    recordId: idRef('record_id')
      .notNull()
      .references(() => benchRecords.id),
    sequence: int('sequence').notNull(),
    bytes: mediumBlob('bytes').notNull(),
  },
  (t) => [uniqueIndex('bench_record_chunks_record_sequence_unique').on(t.recordId, t.sequence)],
);

export type PartImportMappingRow = typeof partImportMappings.$inferSelect;
export type BenchRecordRow = typeof benchRecords.$inferSelect;
