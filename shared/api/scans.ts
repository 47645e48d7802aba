// Scans: a job that runs the engine over one revision; status, progress (0–100) and current stage.
import { z } from 'zod';

export const SCAN_STATUSES = ['queued', 'running', 'done', 'failed', 'cancelled'] as const;
export const ScanStatusSchema = z.enum(SCAN_STATUSES);
export type ScanStatus = z.infer<typeof ScanStatusSchema>;

export const ScanSchema = z.object({
  id: z.uuid(),
  designId: z.uuid(),
  revision: z.number().int(),
  status: ScanStatusSchema,
  progress: z.number().min(0).max(100),
  /** "queued", "parse", "flatten", "extract", "rule <id>", "store", "done"… */
  stage: z.string(),
  startedBy: z.string(),
  createdAt: z.string(),
  startedAt: z.string().nullable(),
  finishedAt: z.string().nullable(),
  /** Milliseconds per stage. */
  timings: z.record(z.string(), z.number()),
  engineVersion: z.string(),
  error: z.string().nullable().optional(),
  ruleErrors: z.array(z.object({ ruleId: z.string(), message: z.string() })),
  proposalCount: z.number().int(),
  /** Times a worker picked it up (more than one after a worker died). */
  attempts: z.number().int(),
  cancelRequested: z.boolean(),
});
export type Scan = z.infer<typeof ScanSchema>;

export const ScanStartBodySchema = z.strictObject({
  revision: z.number().int().min(1).optional(),
  rules: z.array(z.string().min(1).max(80)).min(1).max(50).optional(),
});
export type ScanStartBody = z.infer<typeof ScanStartBodySchema>;

export const ScanParamsSchema = z.strictObject({ id: z.uuid() });
