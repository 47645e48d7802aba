// Role options for invite and role-change pickers, in the order people usually choose them.
import type { Choice } from '@/components/ui';
import type { Role } from '@/components/data/types';
import { roleLabel } from '@/components/navigation/role-labels';

const ORDER: Role[] = ['designer', 'reviewer', 'educator', 'viewer', 'admin'];

export const ROLE_CHOICES: readonly Choice<Role>[] = ORDER.map((role) => ({ value: role, label: roleLabel(role) }));
