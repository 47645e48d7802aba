// The API shape of a scan row.
import type { Scan as ScanRow } from '@/server/db/models';
import type { Scan } from '@/shared/api/scans';

export function scanDto(s: ScanRow, startedBy: string): Scan {
  return {
    id: s.id,
    designId: s.designId,
    revision: s.revisionNumber,
    status: s.status,
    progress: Math.round(s.progress),
    stage: s.stage,
    startedBy,
    createdAt: s.createdAt.toISOString(),
    startedAt: s.startedAt ? s.startedAt.toISOString() : null,
    finishedAt: s.finishedAt ? s.finishedAt.toISOString() : null,
    timings: s.timings ?? {},
    engineVersion: s.engineVersion,
    error: s.error,
    ruleErrors: (s.ruleErrors ?? []).map((e) => ({ ruleId: e.ruleId, message: e.message })),
    proposalCount: s.proposalCount,
    attempts: s.attempts,
    cancelRequested: s.cancelRequested,
  };
}
