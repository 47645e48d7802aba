// Response shape of /api/audit (the team's record of sign-ins, invites, role changes and removals).
import { z } from 'zod';

export const AUDIT_ACTIONS = [
  'sign-in',
  'sign-in-failed',
  'sign-out',
  'invite-sent',
  'invite-revoked',
  'invite-accepted',
  'role-changed',
  'member-removed',
  'password-reset-requested',
  'password-set',
  'upload',
  'scan-started',
  'scan-finished',
  'decision',
  'apply',
  'export',
] as const;
export const AuditActionSchema = z.enum(AUDIT_ACTIONS);
export type AuditAction = z.infer<typeof AuditActionSchema>;

export const AuditEntrySchema = z.object({
  id: z.uuid(),
  at: z.string(),
  /** E-mail of whoever acted, or null when nobody was signed in (e.g. a failed sign-in). */
  actor: z.string().nullable(),
  action: AuditActionSchema,
  target: z.string().nullable(),
  details: z.record(z.string(), z.unknown()),
});
export type AuditEntry = z.infer<typeof AuditEntrySchema>;

export const AuditResponseSchema = z.object({ entries: z.array(AuditEntrySchema) });
export type AuditResponse = z.infer<typeof AuditResponseSchema>;
