export { resolveCommentInputSchema as resolveCommentBodySchema } from '@/features/reviews/schemas';
