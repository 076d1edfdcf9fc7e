export { addCommentInputSchema as addCommentBodySchema } from '@/features/reviews/schemas';
