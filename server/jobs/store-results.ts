// Writes what a scan found, in one transaction: every proposal with its evidence, margins,
// savings, assumptions and overlaps (engine ids mapped to row ids), filed onto boards; earlier
// scans' undecided proposals of the design go out of date, and a proposal already decided on the
// same revision keeps its decision instead of coming back open. Only the worker that still owns the
// scan may write (a swept scan taken over by another worker is left to that worker).
import { Op, QueryTypes } from 'sequelize';
import type { Db } from '@/server/db';
import type { Scan } from '@/server/db/models';
import type { OverlapGraph, RuleErrorRecord } from '@/optimizer/rules/run-rules';
import type { ScannedFinding } from '@/optimizer/rules/scan';
import type { FlatNetlist } from '@/optimizer/netlist/ir';
import { boardsTouched } from '@/server/features/boards/usage';
import { proposalPaths } from '@/server/features/boards/service';

const READINESS = { ready: 'ready', 'failing-margins': 'failing-margins', refuted: 'refuted', unproved: 'unverified' } as const;
const VERDICT = { proved: 'proved', refuted: 'refuted', unproved: 'unverified' } as const;

export type StoreInput = {
  scan: Scan;
  workerId: string;
  /** The scanned design's devices; only their names and paths are read (to file proposals onto boards). */
  flat: { devices: readonly Pick<FlatNetlist['devices'][number], 'name' | 'path'>[] };
  findings: ScannedFinding[];
  overlaps: OverlapGraph;
  ruleErrors: RuleErrorRecord[];
  timings: Record<string, number>;
};

/** Returns the number of proposals stored, or null when the scan is no longer this worker's. */
export async function storeResults(db: Db, input: StoreInput): Promise<number | null> {
  const { scan, flat } = input;
  return db.sequelize.transaction(async (transaction) => {
    const owned = await db.sequelize.query<{ id: string }>(
      `SELECT id FROM scans WHERE id = :id AND status = 'running' AND worker = :worker AND NOT cancel_requested FOR UPDATE`,
      { replacements: { id: scan.id, worker: input.workerId }, type: QueryTypes.SELECT, transaction },
    );
    if (!owned.length) return null;
    const boards = await db.models.Board.findAll({ where: { designId: scan.designId }, transaction });
    const decided = await db.models.Proposal.findAll({
      where: { designId: scan.designId, revisionId: scan.revisionId, status: { [Op.in]: ['accepted', 'rejected', 'applied'] } },
      attributes: ['engineId'],
      transaction,
    });
    const keep = new Set(decided.map((p) => p.engineId));
    await db.models.Proposal.update(
      { status: 'out-of-date' },
      { where: { designId: scan.designId, status: 'open', scanId: { [Op.ne]: scan.id } }, transaction },
    );
    const pathByName = new Map(flat.devices.map((d) => [d.name, d.path.join('.')]));
    const rowId = new Map<string, string>();
    const rows = [];
    for (const f of input.findings) {
      for (const sp of f.proposals) {
        if (keep.has(sp.proposal.id)) continue;
        const s = sp.savings;
        const parts = s.transistors + s.resistors + s.diodes + s.capacitors;
        const margin = sp.margins.some((m) => m.status === 'fail') ? 'fail' : sp.margins.some((m) => m.status === 'warn') ? 'warn' : 'pass';
        const row = await db.models.Proposal.create(
          {
            scanId: scan.id,
            designId: scan.designId,
            revisionId: scan.revisionId,
            revisionNumber: scan.revisionNumber,
            engineId: sp.proposal.id,
            ruleId: f.finding.ruleId,
            title: sp.proposal.title,
            message: f.finding.message,
            location: f.finding.location,
            edit: sp.proposal.edit,
            savings: { ...s, parts },
            savingsParts: parts,
            verification: sp.verification,
            margins: sp.margins,
            assumptionIds: sp.proposal.assumptions,
            verdict: VERDICT[sp.verification.status],
            marginStatus: margin,
            readiness: READINESS[sp.verdict],
            boardIds: boardsTouched(boards, proposalPaths(sp.proposal.edit, pathByName)),
          },
          { transaction },
        );
        rowId.set(sp.proposal.id, row.id);
        rows.push(row);
      }
    }
    const overlaps = new Map<string, Set<string>>();
    for (const e of input.overlaps.edges) {
      const a = rowId.get(e.a);
      const b = rowId.get(e.b);
      if (!a || !b) continue;
      (overlaps.get(a) ?? overlaps.set(a, new Set()).get(a)!).add(b);
      (overlaps.get(b) ?? overlaps.set(b, new Set()).get(b)!).add(a);
    }
    for (const row of rows) {
      const o = overlaps.get(row.id);
      if (o) await row.update({ overlapsWith: [...o].sort() }, { transaction });
    }
    await db.models.Scan.update(
      {
        status: 'done',
        progress: 100,
        stage: 'done',
        finishedAt: new Date(),
        heartbeatAt: new Date(),
        timings: input.timings,
        ruleErrors: input.ruleErrors.map((e) => ({ ruleId: e.ruleId, message: e.message })),
        proposalCount: rows.length,
        error: null,
      },
      { where: { id: scan.id }, transaction },
    );
    return rows.length;
  });
}
