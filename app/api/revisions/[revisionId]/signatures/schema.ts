export { signReviewInputSchema as signReviewBodySchema } from '@/features/reviews/schemas';
