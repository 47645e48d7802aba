// Operating assumptions of a design: an expression over net names the engine's parser accepts,
// who owns it and why it holds. Editing or withdrawing one puts the proposals that relied on it out of date.
import { z } from 'zod';

export const AssumptionSchema = z.object({
  id: z.uuid(),
  expression: z.string(),
  /** The owner's name and e-mail, "Name <email>". */
  owner: z.string(),
  ownerId: z.uuid().nullable(),
  justification: z.string(),
  status: z.enum(['active', 'withdrawn']),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type Assumption = z.infer<typeof AssumptionSchema>;

export const AssumptionBodySchema = z.strictObject({
  expression: z.string().trim().min(1).max(2000),
  justification: z.string().trim().min(1).max(2000),
});
export type AssumptionBody = z.infer<typeof AssumptionBodySchema>;

export const AssumptionPatchBodySchema = z.strictObject({
  expression: z.string().trim().min(1).max(2000).optional(),
  justification: z.string().trim().min(1).max(2000).optional(),
  status: z.enum(['active', 'withdrawn']).optional(),
});
export type AssumptionPatchBody = z.infer<typeof AssumptionPatchBodySchema>;

export const AssumptionParamsSchema = z.strictObject({ id: z.uuid(), aid: z.uuid() });
export const AssumptionListResponseSchema = z.object({ assumptions: z.array(AssumptionSchema) });
