// A scanned demo design for the lesson tests: the Wren-8 write strobe (a NAND that an assumption
// turns into an inverter) and a two-slice tri-state data bus (one-hot enables), run through the
// real engine and stored by the worker's own store step, so proposals carry real margins.
import type { Db } from '@/server/db';
import { parseSource, ENGINE_VERSION } from '@/server/features/designs/engine';
import { storeResults } from '@/server/jobs/store-results';
import { parseExpr } from '@/optimizer/logic/expr-parse';
import { overlapGraph } from '@/optimizer/rules/run-rules';
import { scan } from '@/optimizer/rules/scan';

export const LESSON_DECK = `Wren-8 write strobe and data bus, Larkspur Relay Works (lesson demo)
.global VDD
VDD VDD 0 DC 5
.model NM NMOS (LEVEL=1 VTO=0.7 KP=110u)
.model PM PMOS (LEVEL=1 VTO=-0.7 KP=50u)
* WS = NAND(WR, SEL); the control unit keeps SEL high while WR is
MPW1 WS WR VDD VDD PM
MPW2 WS SEL VDD VDD PM
MNW1 WS WR XW 0 NM
MNW2 XW SEL 0 0 NM
.subckt BUSDRV D EN BUS
MPI ENB EN VDD VDD PM
MNI ENB EN 0 0 NM
MP1 M1 D VDD VDD PM
MP2 BUS ENB M1 VDD PM
MN2 BUS EN M2 0 NM
MN1 M2 D 0 0 NM
.ends
XB0 D0 EN0 BUS BUSDRV
XB1 D1 EN1 BUS BUSDRV
MPR Q BUS VDD VDD PM
MNR Q BUS 0 0 NM
.end
`;

export type LessonDesign = { designId: string; revisionId: string; proposalIds: string[]; byRule: Record<string, string> };

export async function seedLessonDesign(db: Db, teamId: string, name = 'Wren-8 strobe and bus'): Promise<LessonDesign> {
  const parsed = parseSource(LESSON_DECK, 'wren8-strobe-bus.cir');
  const design = await db.models.Design.create({ teamId, name, family: 'cmos', clockPeriodNs: null, createdBy: null });
  const revision = await db.models.Revision.create({
    designId: design.id, number: 1, format: parsed.format, fileName: 'wren8-strobe-bus.cir', source: parsed.text,
    sha256: parsed.sha256, summary: parsed.summary, partCounts: parsed.partCounts, note: null, createdBy: null,
  });
  const rows = await Promise.all(
    ['WR -> SEL', '!(EN0 & EN1)'].map((expression) => db.models.Assumption.create({ designId: design.id, expression, justification: 'the control unit guarantees it', ownerId: null })),
  );
  const assumptions = rows.map((a) => ({ id: a.id, text: a.expression, expr: parseExpr(a.expression) }));
  const scanRow = await db.models.Scan.create({
    designId: design.id, revisionId: revision.id, revisionNumber: 1, rules: null, startedBy: null, engineVersion: ENGINE_VERSION,
    status: 'running', worker: 'lesson-fixture',
  });
  const result = await scan(parsed.flat, { assumptions, targetFamily: 'cmos' });
  const overlaps = overlapGraph(result.findings.map((f) => ({ ...f.finding, proposals: f.proposals.map((p) => p.proposal) })));
  const stored = await storeResults(db, { scan: scanRow, workerId: 'lesson-fixture', flat: parsed.flat, findings: result.findings, overlaps, ruleErrors: result.ruleErrors, timings: {} });
  if (!stored) throw new Error('the lesson fixture scan stored no proposals');
  const proposals = await db.models.Proposal.findAll({ where: { designId: design.id }, order: [['ruleId', 'ASC'], ['id', 'ASC']] });
  return {
    designId: design.id,
    revisionId: revision.id,
    proposalIds: proposals.map((p) => p.id),
    byRule: Object.fromEntries(proposals.map((p) => [p.ruleId, p.id])),
  };
}
