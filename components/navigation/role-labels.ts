// How each role is named and explained to people.
import type { Role } from '@/components/data/types';

const LABELS: Record<Role, { label: string; summary: string }> = {
  admin: { label: 'Admin', summary: 'Manages the team: invites people, sets roles, reads the audit log.' },
  designer: { label: 'Designer', summary: 'Uploads netlists, runs scans, applies accepted rewrites.' },
  reviewer: { label: 'Reviewer', summary: 'Accepts or rejects proposed rewrites with a reason.' },
  educator: { label: 'Educator', summary: 'Builds lessons from designs and shares them.' },
  viewer: { label: 'Viewer', summary: 'Reads what is shared with them.' },
};

export function roleLabel(role: Role): string {
  return LABELS[role].label;
}

export function roleSummary(role: Role): string {
  return LABELS[role].summary;
}
