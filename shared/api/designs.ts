// Request and response shapes of /api/designs (list, upload, detail). Uploads are multipart; their
// text fields arrive as strings, so numbers are coerced.
import { z } from 'zod';
import { AssumptionSchema } from '@/shared/api/assumptions';
import { BoardSchema } from '@/shared/api/boards';
import { PartCountsSchema, RevisionSchema } from '@/shared/api/revisions';
import { ScanSchema } from '@/shared/api/scans';

export const DESIGN_FAMILIES = ['rtl', 'dtl', 'cmos', 'nmos', 'gate'] as const;
export const DesignFamilySchema = z.enum(DESIGN_FAMILIES);
export type DesignFamily = z.infer<typeof DesignFamilySchema>;

export const UPLOAD_FORMATS = ['spice', 'verilog', 'json'] as const;
export const UploadFormatSchema = z.enum(UPLOAD_FORMATS);

export const DesignParamsSchema = z.strictObject({ id: z.uuid() });

const optionalNumber = z.preprocess((v) => (v === '' || v === undefined ? undefined : v), z.coerce.number().nonnegative().optional());
const optionalText = (max: number) =>
  z.preprocess((v) => (typeof v === 'string' && v.trim() === '' ? undefined : v), z.string().trim().min(1).max(max).optional());

/** Text fields of the multipart upload (the file itself is the `file` part). */
export const DesignUploadFieldsSchema = z.strictObject({
  name: z.string().trim().min(1).max(120),
  format: z.preprocess((v) => (v === '' ? undefined : v), UploadFormatSchema.optional()),
  family: z.preprocess((v) => (v === '' ? undefined : v), z.enum([...DESIGN_FAMILIES, 'detect']).optional()),
  boardName: optionalText(120),
  budgetParts: optionalNumber,
  budgetAreaMm2: optionalNumber,
  budgetCost: optionalNumber,
  clockPeriodNs: optionalNumber,
  note: optionalText(500),
});
export type DesignUploadFields = z.infer<typeof DesignUploadFieldsSchema>;

export const DesignListItemSchema = z.object({
  id: z.uuid(),
  name: z.string(),
  family: DesignFamilySchema,
  latestRevision: z.object({ id: z.uuid(), number: z.number().int(), partCounts: PartCountsSchema, createdAt: z.string() }),
  openProposals: z.number().int(),
  boards: z.number().int(),
  updatedAt: z.string(),
});
export type DesignListItem = z.infer<typeof DesignListItemSchema>;
export const DesignListResponseSchema = z.object({ designs: z.array(DesignListItemSchema) });
export type DesignListResponse = z.infer<typeof DesignListResponseSchema>;

export const DesignDetailSchema = z.object({
  id: z.uuid(),
  name: z.string(),
  family: DesignFamilySchema,
  teamId: z.uuid(),
  createdBy: z.string(),
  revisions: z.array(RevisionSchema),
  boards: z.array(BoardSchema),
  assumptions: z.array(AssumptionSchema),
  latestScan: ScanSchema.nullable(),
  clockPeriodNs: z.number().optional(),
});
export type DesignDetail = z.infer<typeof DesignDetailSchema>;

/** One located problem with an uploaded file (400 "parse-error" details.diagnostics). */
export const UploadDiagnosticSchema = z.object({
  severity: z.enum(['error', 'warning']),
  code: z.string(),
  message: z.string(),
  line: z.number().int().nullable(),
  col: z.number().int().nullable(),
  file: z.string().nullable(),
});
export type UploadDiagnostic = z.infer<typeof UploadDiagnosticSchema>;
