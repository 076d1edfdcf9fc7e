export { updateProgramInputSchema as updateProgramBodySchema } from '@/features/programs/schemas';
