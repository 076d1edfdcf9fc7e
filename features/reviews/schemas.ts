/**
 * Request bodies of the review routes (zod), each message naming the field and the reason.
 */
import { z } from 'zod';
import { reviewStageIds } from '@/features/reviews/anchors';

const unknownKeys = (issue: { code?: string; keys?: string[] }) =>
  issue.code === 'unrecognized_keys' ? `unknown field: ${(issue.keys ?? []).join(', ')}` : 'the request body must be a JSON object';

const idSchema = (what: string) =>
  z
    .union([z.string(), z.number()], { error: `${what} must be an id` })
    .transform((v) => String(v))
    .refine((v) => /^[1-9][0-9]{0,15}$/.test(v), { message: `${what} must be a positive whole number` })
    .transform((v) => Number(v));

/** POST /api/revisions/[revisionId]/review: ask chosen members to review. */
export const requestReviewInputSchema = z.strictObject(
  {
    reviewerUserIds: z
      .array(idSchema('reviewerUserIds entry'), { error: 'reviewerUserIds must be a list of member ids' })
      .min(1, { message: 'reviewerUserIds must name at least one reviewer' })
      .max(20, { message: 'reviewerUserIds may name at most 20 reviewers' })
      .refine((ids) => new Set(ids).size === ids.length, { message: 'reviewerUserIds must not name a reviewer twice' }),
    message: z
      .string({ error: 'message must be text' })
      .trim()
      .max(2000, { message: 'message must be at most 2000 characters' })
      .default(''),
  },
  { error: unknownKeys },
);
export type RequestReviewInput = z.infer<typeof requestReviewInputSchema>;

const commentBody = z
  .string({ error: 'body must be text' })
  .trim()
  .min(1, { message: 'body must not be empty' })
  .max(10_000, { message: 'body must be at most 10000 characters' });

const anchoredCommentSchema = z.discriminatedUnion(
  'anchorKind',
  [
    z.strictObject(
      {
        anchorKind: z.literal('stage'),
        anchorId: z.enum(reviewStageIds, { error: `anchorId must be one of ${reviewStageIds.join(', ')}` }),
        body: commentBody,
      },
      { error: unknownKeys },
    ),
    z.strictObject(
      {
        anchorKind: z.literal('check'),
        anchorId: z
          .string({ error: 'anchorId must be a check id' })
          .regex(/^[a-z0-9][a-z0-9-]{0,99}$/, { message: 'anchorId must be a check id (lower-case letters, digits and hyphens)' }),
        body: commentBody,
      },
      { error: unknownKeys },
    ),
  ],
  { error: 'anchorKind must be stage or check (or give parentCommentId to reply)' },
);
const replySchema = z.strictObject({ parentCommentId: idSchema('parentCommentId'), body: commentBody }, { error: unknownKeys });

/**
 * POST /api/revisions/[revisionId]/comments: a new comment anchored to a stage or a check
 * (`{ anchorKind, anchorId, body }`), or a reply (`{ parentCommentId, body }`, which takes its
 * thread's anchor). Picking the shape first keeps each message about the shape the caller meant.
 */
export const addCommentInputSchema = z.unknown().transform((value, ctx) => {
  const isReply = value !== null && typeof value === 'object' && 'parentCommentId' in value;
  const result = (isReply ? replySchema : anchoredCommentSchema).safeParse(value);
  if (!result.success) {
    for (const issue of result.error.issues) ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message });
    return z.NEVER;
  }
  return result.data as
    | { anchorKind: 'stage'; anchorId: (typeof reviewStageIds)[number]; body: string }
    | { anchorKind: 'check'; anchorId: string; body: string }
    | { parentCommentId: number; body: string };
});
export type AddCommentInput = z.output<typeof addCommentInputSchema>;

/** PATCH /api/reviews/comments/[commentId]: resolve or reopen. */
export const resolveCommentInputSchema = z.strictObject(
  { resolved: z.boolean({ error: 'resolved must be true or false' }) },
  { error: unknownKeys },
);

/** POST /api/revisions/[revisionId]/signatures: a decision signed with the password. */
export const signReviewInputSchema = z.strictObject(
  {
    meaning: z.enum(['approved', 'changes-requested'], { error: 'meaning must be approved or changes-requested' }),
    password: z
      .string({ error: 'password must be text' })
      .min(1, { message: 'password is required to sign' })
      .max(200, { message: 'password must be at most 200 characters' }),
    /** The content hash the signer is looking at; the signature is refused if the revision differs. */
    contentHash: z
      .string({ error: 'contentHash must be text' })
      .regex(/^[0-9a-f]{64}$/, { message: 'contentHash must be 64 lowercase hexadecimal digits' }),
    note: z.string({ error: 'note must be text' }).trim().max(2000, { message: 'note must be at most 2000 characters' }).default(''),
  },
  { error: unknownKeys },
);
export type SignReviewInput = z.infer<typeof signReviewInputSchema>;
