// Boards of a design: instance path prefixes grouped onto one board with a budget, and the board's
// use before and after the accepted proposals.
import { z } from 'zod';

export const BudgetSchema = z.strictObject({
  parts: z.number().int().nonnegative().optional(),
  areaMm2: z.number().nonnegative().optional(),
  cost: z.number().nonnegative().optional(),
});
export type Budget = z.infer<typeof BudgetSchema>;

export const UsageSchema = z.object({ parts: z.number(), areaMm2: z.number(), cost: z.number() });

export const BoardSchema = z.object({
  id: z.uuid(),
  name: z.string(),
  /** Instance path prefixes ("X3", "XALU.XB0"); empty = the whole design. */
  instances: z.array(z.string()),
  budget: BudgetSchema,
  usage: z.object({ before: UsageSchema, afterAccepted: UsageSchema }),
  /** Currency of `cost` (the parts table's; the demo prices are invented). */
  currency: z.string(),
});
export type Board = z.infer<typeof BoardSchema>;

const InstancesSchema = z.array(z.string().trim().min(1).max(200).regex(/^[^\s]+$/, 'no spaces in an instance path')).max(200);

export const BoardBodySchema = z.strictObject({
  name: z.string().trim().min(1).max(120),
  instances: InstancesSchema.default([]),
  budget: BudgetSchema.default({}),
});
export type BoardBody = z.infer<typeof BoardBodySchema>;

export const BoardPatchBodySchema = z.strictObject({
  name: z.string().trim().min(1).max(120).optional(),
  instances: InstancesSchema.optional(),
  budget: BudgetSchema.optional(),
});
export type BoardPatchBody = z.infer<typeof BoardPatchBodySchema>;

export const BoardParamsSchema = z.strictObject({ id: z.uuid(), bid: z.uuid() });
export const BoardListResponseSchema = z.object({ boards: z.array(BoardSchema) });
