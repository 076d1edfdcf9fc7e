/**
 * What each role may do, as pure functions of the signed-in member. The same functions hide
 * controls in the interface and refuse requests on the server (the guard calls them).
 *
 * Source: the product's roles table —
 *   admin:     everything an engineer can, plus manage members and roles of the workspace
 *   engineer:  create and edit programs, channel plans, part libraries; upload bench records; request reviews
 *   reviewer:  read everything in the workspace; comment on any stage; approve or ask for changes
 *   regulator: read released revisions, their review record and audit trail; export; never any write
 */
import type { Role } from '@/lib/auth/roles';

/** The part of a signed-in member that permissions depend on. */
export interface Actor {
  role: Role;
}

const isOneOf = (actor: Actor, allowed: readonly Role[]) => allowed.includes(actor.role);

/** Invite members, change roles. */
export function canManageMembers(actor: Actor): boolean {
  return isOneOf(actor, ['admin']);
}

/** Create and edit programs and channel plans (drafts). */
export function canEditPlans(actor: Actor): boolean {
  return isOneOf(actor, ['admin', 'engineer']);
}

/** Create, edit and import part libraries. */
export function canEditParts(actor: Actor): boolean {
  return isOneOf(actor, ['admin', 'engineer']);
}

/** Upload bench records and attach them to revisions. */
export function canUploadBenchRecords(actor: Actor): boolean {
  return isOneOf(actor, ['admin', 'engineer']);
}

/** Submit a revision for review and choose its reviewers. */
export function canRequestReview(actor: Actor): boolean {
  return isOneOf(actor, ['admin', 'engineer']);
}

/**
 * Comment on a stage or check of a revision, reply and resolve: every role that writes (the
 * author answers the reviewer's comments in the same thread).
 */
export function canCommentOnReview(actor: Actor): boolean {
  return isOneOf(actor, ['admin', 'engineer', 'reviewer']);
}

/**
 * Be chosen as a reviewer and approve, or ask for changes on, a revision under review (with
 * re-entered password). Admins may review too (a small team's lead often signs); the author and
 * the requester of a review never sign it (features/reviews/review-rules.ts).
 */
export function canDecideReview(actor: Actor): boolean {
  return isOneOf(actor, ['reviewer', 'admin']);
}

/** Read drafts, revisions in any state, part libraries and bench records: everything in the workspace. */
export function canReadWorkInProgress(actor: Actor): boolean {
  return isOneOf(actor, ['admin', 'engineer', 'reviewer']);
}

/** Read released revisions with their review record. Every role may. */
export function canReadReleased(actor: Actor): boolean {
  return isOneOf(actor, ['admin', 'engineer', 'reviewer', 'regulator']);
}

/** Read the audit trail. Every role may. */
export function canReadAuditTrail(actor: Actor): boolean {
  return isOneOf(actor, ['admin', 'engineer', 'reviewer', 'regulator']);
}

/** Export a design rationale (PDF, JSON) of what the member may read. Every role may. */
export function canExport(actor: Actor): boolean {
  return isOneOf(actor, ['admin', 'engineer', 'reviewer', 'regulator']);
}

/** The regulator never writes anything; every other role writes something. */
export function canWriteAnything(actor: Actor): boolean {
  return actor.role !== 'regulator';
}
