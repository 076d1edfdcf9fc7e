export { requestReviewInputSchema as requestReviewBodySchema } from '@/features/reviews/schemas';
