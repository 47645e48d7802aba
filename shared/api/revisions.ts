// Revisions of a design (immutable; numbered from 1 within a design), the apply body and exports.
import { z } from 'zod';

export const PartCountsSchema = z.object({
  transistors: z.number().int(),
  resistors: z.number().int(),
  diodes: z.number().int(),
  capacitors: z.number().int(),
  gates: z.number().int(),
  total: z.number().int(),
});
export type PartCounts = z.infer<typeof PartCountsSchema>;

export const RevisionSchema = z.object({
  id: z.uuid(),
  number: z.number().int().min(1),
  format: z.enum(['spice', 'verilog', 'json', 'pla']),
  sha256: z.string(),
  partCounts: PartCountsSchema,
  /** Change against the previous revision (all zero for revision 1). */
  delta: PartCountsSchema,
  createdBy: z.string(),
  createdAt: z.string(),
  note: z.string().nullable(),
  /** Proposals applied to make this revision (engine ids), empty for uploads. */
  appliedProposals: z.array(z.uuid()),
});
export type Revision = z.infer<typeof RevisionSchema>;

/** JSON body of POST /api/designs/:id/revisions: apply accepted proposals to the latest revision. */
export const ApplyBodySchema = z.strictObject({
  applyProposalIds: z.array(z.uuid()).min(1).max(500),
  baseRevision: z.number().int().min(1),
  note: z.string().trim().min(1).max(500).optional(),
});
export type ApplyBody = z.infer<typeof ApplyBodySchema>;

/** Text fields of a multipart upload of a new source. */
export const RevisionUploadFieldsSchema = z.strictObject({
  format: z.preprocess((v) => (v === '' ? undefined : v), z.enum(['spice', 'verilog', 'json']).optional()),
  note: z.preprocess((v) => (typeof v === 'string' && v.trim() === '' ? undefined : v), z.string().trim().min(1).max(500).optional()),
});

export const EXPORT_FORMATS = ['spice', 'verilog', 'json', 'bom', 'report', 'report-html'] as const;
export const ExportFormatSchema = z.enum(EXPORT_FORMATS);
export type ExportFormat = z.infer<typeof ExportFormatSchema>;

export const ExportParamsSchema = z.strictObject({ id: z.uuid(), rev: z.coerce.number().int().min(1) });
export const ExportQuerySchema = z.strictObject({ format: ExportFormatSchema });
