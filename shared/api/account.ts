// Request and response shapes of /api/account (the signed-in person's name and notification choices).
import { z } from 'zod';
import { UserSchema } from '@/shared/api/auth';

export const NotificationPrefsSchema = z.object({
  reviewRequests: z.boolean(),
  decisions: z.boolean(),
});
export type NotificationPrefs = z.infer<typeof NotificationPrefsSchema>;

export const AccountResponseSchema = z.object({
  user: UserSchema,
  notifications: NotificationPrefsSchema,
});
export type AccountResponse = z.infer<typeof AccountResponseSchema>;

export const AccountPatchBodySchema = z.strictObject({
  name: z.string().trim().min(1).max(120).optional(),
  notifications: z
    .strictObject({ reviewRequests: z.boolean().optional(), decisions: z.boolean().optional() })
    .optional(),
});
export type AccountPatchBody = z.infer<typeof AccountPatchBodySchema>;
