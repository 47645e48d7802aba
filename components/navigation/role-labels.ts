// How each role is named and explained to people.
import { ROLE_LABELS, type Role } from '@/shared/domain/roles';

const SUMMARIES: Record<Role, string> = {
  admin: 'Manages the team: invites people, sets roles, reads the audit log.',
  designer: 'Uploads netlists, runs scans, applies accepted rewrites.',
  reviewer: 'Accepts or rejects proposed rewrites with a reason.',
  educator: 'Builds lessons from designs and shares them.',
  viewer: 'Reads what is shared with them.',
};

export function roleLabel(role: Role): string {
  return ROLE_LABELS[role];
}

export function roleSummary(role: Role): string {
  return SUMMARIES[role];
}
