// The API shape of revisions, with each one's part delta against the one before.
import type { Revision as RevisionRow } from '@/server/db/models';
import { labelOf } from '@/server/features/designs/users';
import type { PartCounts, Revision } from '@/shared/api/revisions';

const KEYS = ['transistors', 'resistors', 'diodes', 'capacitors', 'gates', 'total'] as const;

export function revisionDtos(rows: RevisionRow[], labels: Map<string, string>): Revision[] {
  const sorted = [...rows].sort((a, b) => a.number - b.number);
  return sorted.map((r, k) => {
    const prev = k > 0 ? sorted[k - 1]!.partCounts : r.partCounts;
    const delta = Object.fromEntries(KEYS.map((key) => [key, r.partCounts[key] - prev[key]])) as PartCounts;
    return {
      id: r.id,
      number: r.number,
      format: r.format,
      sha256: r.sha256,
      partCounts: r.partCounts,
      delta,
      createdBy: labelOf(labels, r.createdBy),
      createdAt: r.createdAt.toISOString(),
      note: r.note,
      appliedProposals: r.appliedProposals ?? [],
    };
  });
}
