// Team roles and what each may do at a glance; the server checks them on every route, the client
// uses them to choose which tabs to show.
import { z } from 'zod';

export const ROLES = ['admin', 'designer', 'reviewer', 'educator', 'viewer'] as const;
export const RoleSchema = z.enum(ROLES);
export type Role = z.infer<typeof RoleSchema>;

/** Human labels for roles (used in lists and e-mails). */
export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Admin',
  designer: 'Designer',
  reviewer: 'Reviewer',
  educator: 'Educator',
  viewer: 'Viewer',
};
