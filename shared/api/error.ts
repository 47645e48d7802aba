// The one error body every /api response uses on failure: { error: { code, message, details? } }.
import { z } from 'zod';

/** Codes the server sends; clients map them to sentences in one place. */
export const ERROR_CODES = [
  'bad-request',
  'malformed-json',
  'too-large',
  'unauthorized',
  'bad-credentials',
  'forbidden',
  'csrf',
  'not-found',
  'conflict',
  'last-admin',
  'already-member',
  'token-invalid',
  'rate-limited',
  'unavailable',
  'internal',
  // Review workflow (designs, scans, proposals, apply, exports).
  'parse-error',
  'assumption-parse',
  'revision-moved',
  'proposals-overlap',
  'not-accepted',
  'own-scan',
  'not-open',
  'scan-finished',
  'export-unsupported',
] as const;
export const ErrorCodeSchema = z.enum(ERROR_CODES);
export type ErrorCode = z.infer<typeof ErrorCodeSchema>;

/** One problem with one field of the input (from zod's issues). */
export const FieldIssueSchema = z.object({
  path: z.string(),
  message: z.string(),
});
export type FieldIssue = z.infer<typeof FieldIssueSchema>;

export const ErrorBodySchema = z.object({
  error: z.object({
    // A string rather than the enum so an older client still reads a newer server's codes.
    code: z.string(),
    message: z.string(),
    details: z.unknown().optional(),
  }),
});
export type ErrorBody = z.infer<typeof ErrorBodySchema>;
