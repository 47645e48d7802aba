// Review: decisions on a proposal, comments, and the team's review queue.
import { z } from 'zod';
import { CommentSchema, ProposalSummarySchema } from '@/shared/api/proposals';

export const DecisionBodySchema = z
  .strictObject({
    decision: z.enum(['accept', 'reject']),
    reason: z.string().trim().min(1).max(2000).optional(),
  })
  .refine((b) => b.decision !== 'reject' || b.reason !== undefined, { message: 'a rejection needs a reason', path: ['reason'] });
export type DecisionBody = z.infer<typeof DecisionBodySchema>;

export const CommentBodySchema = z.strictObject({ body: z.string().trim().min(1).max(4000) });
export const CommentListResponseSchema = z.object({ comments: z.array(CommentSchema) });

export const ReviewQueueItemSchema = ProposalSummarySchema.extend({ designName: z.string() });
export const ReviewQueueResponseSchema = z.object({ proposals: z.array(ReviewQueueItemSchema) });
export type ReviewQueueResponse = z.infer<typeof ReviewQueueResponseSchema>;
