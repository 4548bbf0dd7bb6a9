import { z } from 'zod';

/** `POST /api/programs/:programId/results/:resultId/acknowledgements` */
export const CaveatAcknowledgeSchema = z.object({
  caveatCode: z.string().min(1).max(64),
  comment: z.string().trim().min(1, 'Say what you make of this caveat (it is kept in the audit trail).').max(2000),
});
export type CaveatAcknowledgeInput = z.infer<typeof CaveatAcknowledgeSchema>;
