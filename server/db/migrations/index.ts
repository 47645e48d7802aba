// Every migration, in order. An explicit list (not a glob) so umzug finds them under tsx and vitest
// alike; later features append theirs here.
import { foundation } from '@/server/db/migrations/0001-foundation';
import { workflow } from '@/server/db/migrations/0002-workflow';
import { lessons } from '@/server/db/migrations/0003-lessons';
import type { Migration } from '@/server/db/migrations/types';

export const MIGRATIONS: readonly Migration[] = [foundation, workflow, lessons];
