export { savePlanInputSchema as savePlanBodySchema, updatePlanInputSchema as updatePlanBodySchema } from '@/features/plans/schemas';
