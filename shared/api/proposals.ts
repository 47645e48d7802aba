// Proposals a scan left: summary (lists, queue), detail (edit, evidence, margins, decisions,
// comments), and the list's filters and sorts.
import { z } from 'zod';

export const PROPOSAL_STATUSES = ['open', 'accepted', 'rejected', 'out-of-date', 'applied'] as const;
export const ProposalStatusSchema = z.enum(PROPOSAL_STATUSES);
export type ProposalStatus = z.infer<typeof ProposalStatusSchema>;

/** proved / refuted by the checks; unverified when no proof ran (nothing comparable changed). */
export const VERDICTS = ['proved', 'refuted', 'unverified'] as const;
export const VerdictSchema = z.enum(VERDICTS);
export const READINESS = ['ready', 'failing-margins', 'refuted', 'unverified'] as const;
export const MarginStatusSchema = z.enum(['pass', 'warn', 'fail']);

export const SavingsSchema = z.object({
  transistors: z.number(),
  resistors: z.number(),
  diodes: z.number(),
  capacitors: z.number(),
  gates: z.number(),
  parts: z.number(),
  areaMm2: z.number(),
  cost: z.number(),
});
export type Savings = z.infer<typeof SavingsSchema>;

export const ProposalSummarySchema = z.object({
  id: z.uuid(),
  /** The engine's stable id (rule + location hash). */
  engineId: z.string(),
  scanId: z.uuid(),
  designId: z.uuid(),
  revision: z.number().int(),
  ruleId: z.string(),
  title: z.string(),
  message: z.string(),
  location: z.object({ devices: z.array(z.string()), instances: z.array(z.string()), nets: z.array(z.string()) }),
  savings: SavingsSchema,
  verdict: VerdictSchema,
  marginStatus: MarginStatusSchema,
  status: ProposalStatusSchema,
  readiness: z.enum(READINESS),
  overlapsWith: z.array(z.uuid()),
  boardIds: z.array(z.uuid()),
  createdAt: z.string(),
});
export type ProposalSummary = z.infer<typeof ProposalSummarySchema>;

export const MarginSchema = z.object({
  name: z.string(),
  value: z.number(),
  limit: z.number(),
  unit: z.string(),
  status: MarginStatusSchema,
  corner: z.object({ supply: z.number(), resistors: z.string(), beta: z.number().optional() }),
  note: z.string(),
});
export type Margin = z.infer<typeof MarginSchema>;

export const EvidenceSchema = z.object({
  verdict: VerdictSchema,
  /** exhaustive | sat | random (logic), switch-level (contention/floating found), none. */
  method: z.string(),
  assumptionsUsed: z.array(z.object({ id: z.uuid(), expression: z.string() })),
  counterexample: z
    .object({
      inputs: z.record(z.string(), z.union([z.literal(0), z.literal(1)])),
      outputs: z.array(z.object({ name: z.string(), before: z.union([z.literal(0), z.literal(1)]), after: z.union([z.literal(0), z.literal(1)]) })),
    })
    .optional(),
  switchSim: z.object({
    vectors: z.number().int(),
    contention: z.array(z.string()),
    floating: z.array(z.string()),
    sneakPaths: z.array(z.string()),
  }),
  compared: z.array(z.string()),
  note: z.string().optional(),
});
export type Evidence = z.infer<typeof EvidenceSchema>;

export const DecisionSchema = z.object({ decision: z.enum(['accept', 'reject']), reason: z.string().nullable(), reviewer: z.string(), at: z.string() });
export const CommentSchema = z.object({ id: z.uuid(), author: z.string(), body: z.string(), createdAt: z.string() });
export type Comment = z.infer<typeof CommentSchema>;

export const EditSchema = z.object({
  removeDevices: z.array(z.string()),
  addDevices: z.array(z.record(z.string(), z.unknown())),
  reconnect: z.array(z.object({ device: z.string(), terminal: z.number(), net: z.string() })),
  mergeNets: z.array(z.object({ keep: z.string(), remove: z.string() })),
  addModels: z.array(z.object({ name: z.string(), type: z.string(), params: z.record(z.string(), z.unknown()) })).optional(),
});

export const ProposalDetailSchema = ProposalSummarySchema.extend({
  edit: EditSchema,
  evidence: EvidenceSchema,
  margins: z.array(MarginSchema),
  decisions: z.array(DecisionSchema),
  comments: z.array(CommentSchema),
  designName: z.string(),
  startedBy: z.string(),
  /** Cautions shown beside every proposal (first-order margins; check data sheets and the bench). */
  cautions: z.array(z.string()),
});
export type ProposalDetail = z.infer<typeof ProposalDetailSchema>;

export const PROPOSAL_SORTS = ['savings', 'rule', 'status', 'created'] as const;
export const ProposalListQuerySchema = z.strictObject({
  rule: z.string().min(1).max(80).optional(),
  status: ProposalStatusSchema.optional(),
  verdict: VerdictSchema.optional(),
  board: z.uuid().optional(),
  sort: z.enum(PROPOSAL_SORTS).default('savings'),
  order: z.enum(['asc', 'desc']).optional(),
});
export type ProposalListQuery = z.infer<typeof ProposalListQuerySchema>;

export const ProposalListResponseSchema = z.object({ proposals: z.array(ProposalSummarySchema) });
export const ProposalParamsSchema = z.strictObject({ id: z.uuid() });
