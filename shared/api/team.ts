// Request and response shapes of /api/team/* (members, invites, role changes, captured mail).
import { z } from 'zod';
import { RoleSchema } from '@/shared/domain/roles';
import { EmailSchema, IdSchema, TeamRefSchema } from '@/shared/api/auth';

export const MemberSchema = z.object({
  userId: IdSchema,
  email: z.string(),
  name: z.string(),
  role: RoleSchema,
  joinedAt: z.string(),
});
export type Member = z.infer<typeof MemberSchema>;

export const InviteSchema = z.object({
  id: IdSchema,
  email: z.string(),
  role: RoleSchema,
  expiresAt: z.string(),
});
export type Invite = z.infer<typeof InviteSchema>;

export const TeamResponseSchema = z.object({
  team: TeamRefSchema,
  members: z.array(MemberSchema),
  invites: z.array(InviteSchema),
});
export type TeamResponse = z.infer<typeof TeamResponseSchema>;

export const InviteBodySchema = z.strictObject({ email: EmailSchema, role: RoleSchema });
export type InviteBody = z.infer<typeof InviteBodySchema>;

export const InviteParamsSchema = z.strictObject({ id: IdSchema });
export const MemberParamsSchema = z.strictObject({ userId: IdSchema });

export const MemberPatchBodySchema = z.strictObject({ role: RoleSchema });
export type MemberPatchBody = z.infer<typeof MemberPatchBodySchema>;

export const OutboxMessageSchema = z.object({
  id: IdSchema,
  to: z.string(),
  subject: z.string(),
  text: z.string(),
  html: z.string().optional(),
  receivedAt: z.string(),
});
export type OutboxMessage = z.infer<typeof OutboxMessageSchema>;

export const OutboxResponseSchema = z.object({ messages: z.array(OutboxMessageSchema) });
export type OutboxResponse = z.infer<typeof OutboxResponseSchema>;
