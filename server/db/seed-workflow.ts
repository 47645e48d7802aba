// The development demo's living workspace: the Larkspur Relay Works team's Wren-8 designs
// (server/db/demo/, our own invented decks) uploaded by the designer, a board with a budget,
// an operating assumption, each design scanned in-process, and two proposals decided by the
// reviewer (one accepted, one rejected with a reason). Skipped when the team already has designs.
import fs from 'node:fs';
import path from 'node:path';
import type { Db } from '@/server/db';
import { createEspressoMinimiser } from '@/optimizer/logic/espresso/espresso-minimiser';
import { createDesign } from '@/server/features/designs/service';
import { createAssumption } from '@/server/features/assumptions/service';
import { ENGINE_VERSION } from '@/server/features/designs/engine';
import { decide } from '@/server/features/review/service';
import { runScan } from '@/server/jobs/run-scan';

const DEMO_DIR = path.join(__dirname, 'demo');

type DemoDesign = {
  file: string;
  name: string;
  family: 'rtl' | 'dtl' | 'cmos';
  board?: { name: string; parts: number; areaMm2: number; cost: number };
  assumption?: { expression: string; justification: string };
};

export const DEMO_DESIGNS: readonly DemoDesign[] = [
  {
    file: 'wren8-register-slice.cir',
    name: 'Wren-8 register slice',
    family: 'rtl',
    board: { name: 'Register card A', parts: 36, areaMm2: 1000, cost: 1.2 },
    assumption: {
      expression: '!(CLR & LD)',
      justification: 'Clear and load are never together: the Wren-8 sequencer drives CLR only in the reset microstep, when LD is held low (demo scenario).',
    },
  },
  { file: 'wren8-bus-driver.cir', name: 'Wren-8 bus driver', family: 'dtl', board: { name: 'Bus card', parts: 24, areaMm2: 700, cost: 0.9 } },
  { file: 'wren8-decoder.cir', name: 'Wren-8 register-select decoder', family: 'cmos' },
];

export async function seedWorkflow(db: Db, teamId: string): Promise<string[]> {
  if (await db.models.Design.count({ where: { teamId } })) return [];
  const designer = await db.models.User.findOne({ where: { email: 'designer@trimwire.test' } });
  const reviewer = await db.models.User.findOne({ where: { email: 'reviewer@trimwire.test' } });
  if (!designer || !reviewer) return [];
  const created: string[] = [];
  const minimiser = createEspressoMinimiser({ size: 1 });
  try {
    for (const d of DEMO_DESIGNS) {
      const buffer = fs.readFileSync(path.join(DEMO_DIR, d.file));
      const design = await createDesign(db, designer, teamId, { buffer, name: d.file }, {
        name: d.name,
        family: d.family,
        ...(d.board ? { boardName: d.board.name, budgetParts: d.board.parts, budgetAreaMm2: d.board.areaMm2, budgetCost: d.board.cost } : {}),
        note: 'Demo design (invented for the Larkspur Relay Works scenario).',
      });
      if (d.assumption) await createAssumption(db, design, designer, d.assumption);
      const rev = await db.models.Revision.findOne({ where: { designId: design.id, number: 1 } });
      const scan = await db.models.Scan.create({ designId: design.id, revisionId: rev!.id, revisionNumber: 1, rules: null, startedBy: designer.id, engineVersion: ENGINE_VERSION });
      await runScan({ db, workerId: 'seed', minimiser, heartbeatTimeoutS: 120, maxAttempts: 3 }, scan.id);
      created.push(`design ${d.name}`);
    }
    // One accepted and one rejected proposal, on the design with the most to review.
    const open = await db.models.Proposal.findAll({ where: { status: 'open' }, order: [['savingsParts', 'DESC'], ['id', 'ASC']] });
    const ready = open.find((p) => p.readiness === 'ready');
    if (ready) await decide(db, ready.id, teamId, reviewer, { decision: 'accept' });
    const other = (await db.models.Proposal.findAll({ where: { status: 'open' }, order: [['savingsParts', 'ASC'], ['id', 'ASC']] })).find((p) => p.readiness !== 'ready') ;
    if (other) {
      await decide(db, other.id, teamId, reviewer, {
        decision: 'reject',
        reason: 'The shared line would rise too slowly at the Wren-8 clock; keep the per-bit parts until the bench check (demo decision).',
      });
    }
  } finally {
    minimiser.close();
  }
  return created;
}
