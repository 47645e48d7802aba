// Request and response shapes of /api/auth/* (sign-in, sign-out, me, team switch, reset, set password).
import { z } from 'zod';
import { RoleSchema } from '@/shared/domain/roles';

export const PASSWORD_MIN_LENGTH = 10;
export const PASSWORD_MAX_LENGTH = 200;

export const EmailSchema = z.string().trim().toLowerCase().pipe(z.email().max(254));
export const PasswordSchema = z.string().min(PASSWORD_MIN_LENGTH).max(PASSWORD_MAX_LENGTH);
export const IdSchema = z.uuid();

export const CsrfResponseSchema = z.object({ csrfToken: z.string() });
export type CsrfResponse = z.infer<typeof CsrfResponseSchema>;

export const SignInBodySchema = z.strictObject({
  email: EmailSchema,
  // Sign-in accepts any non-empty password so an old short one gets "bad credentials", not "bad request".
  password: z.string().min(1).max(PASSWORD_MAX_LENGTH),
});
export type SignInBody = z.infer<typeof SignInBodySchema>;

export const SwitchTeamBodySchema = z.strictObject({ teamId: IdSchema });
export type SwitchTeamBody = z.infer<typeof SwitchTeamBodySchema>;

export const PasswordResetBodySchema = z.strictObject({ email: EmailSchema });
export type PasswordResetBody = z.infer<typeof PasswordResetBodySchema>;

export const SetPasswordBodySchema = z.strictObject({
  token: z.string().min(1).max(200),
  password: PasswordSchema,
});
export type SetPasswordBody = z.infer<typeof SetPasswordBodySchema>;

export const UserSchema = z.object({ id: IdSchema, email: z.string(), name: z.string() });
export type User = z.infer<typeof UserSchema>;

export const TeamRefSchema = z.object({ id: IdSchema, name: z.string() });
export type TeamRef = z.infer<typeof TeamRefSchema>;

export const MeSchema = z.object({
  user: UserSchema,
  team: TeamRefSchema,
  role: RoleSchema,
  teams: z.array(TeamRefSchema.extend({ role: RoleSchema })),
});
export type Me = z.infer<typeof MeSchema>;
