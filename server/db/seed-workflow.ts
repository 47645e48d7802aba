// The development demo's living workspace: the Larkspur Relay Works team's Wren-8 designs
// (server/db/demo/, our own invented decks and modules, each listed with the rules it shows)
// uploaded by the designer with their boards and assumptions, each scanned in-process, and two
// proposals decided by the reviewer (one accepted, one refused on margins rejected with the
// reason). Skipped when the team already has designs.
import fs from 'node:fs';
import path from 'node:path';
import type { Verdict } from '@/optimizer/rules/scan';
import type { Db } from '@/server/db';
import { createEspressoMinimiser } from '@/optimizer/logic/espresso/espresso-minimiser';
import { createDesign } from '@/server/features/designs/service';
import { createAssumption } from '@/server/features/assumptions/service';
import { ENGINE_VERSION } from '@/server/features/designs/engine';
import { decide } from '@/server/features/review/service';
import { runScan } from '@/server/jobs/run-scan';
import type { DesignFamily } from '@/shared/api/designs';

const DEMO_DIR = path.join(__dirname, 'demo');

/** A rule the design is there to show, with the verdict its scan (as seeded) gives it. */
export type DemoShows = { rule: string; verdict: Verdict };

export type DemoDesign = {
  file: string;
  name: string;
  family: DesignFamily;
  /** Transistor level (a SPICE-style deck that ngspice runs) or gate level (structural Verilog). */
  level: 'transistor' | 'gate';
  board?: { name: string; parts: number; areaMm2: number; cost: number };
  /** The design's clock period in nanoseconds, where its rules check rise times against it. */
  clockPeriodNs?: number;
  assumption?: { expression: string; justification: string };
  /** What the design is there to show: every pair appears in its scan. */
  shows: readonly DemoShows[];
  /** A rewrite that the margins refuse: its rule and the margin that fails. */
  refusedOnMargin?: { rule: string; margin: string };
  /** A rewrite valid only under the design's assumption: proved with it, refuted or absent without. */
  onlyUnderAssumption?: { rule: string };
};

/**
 * The Wren-8 demo set (Larkspur Relay Works, invented): every rule of the catalogue shown at least
 * once, in six transistor-level decks (RTL, DTL, CMOS, NMOS with resistor loads) and two gate-level
 * modules. Boards, budgets and prices are invented for the demo.
 */
export const DEMO_DESIGNS: readonly DemoDesign[] = [
  {
    file: 'wren8-register-slice.cir',
    name: 'Wren-8 register slice',
    family: 'rtl',
    level: 'transistor',
    board: { name: 'Register card A', parts: 36, areaMm2: 1000, cost: 1.2 },
    assumption: {
      expression: '!(CLR & LD)',
      justification: 'Clear and load are never together: the Wren-8 sequencer drives CLR only in the reset microstep, when LD is held low (demo scenario).',
    },
    shows: [
      { rule: 'shared-control-driver', verdict: 'ready' },
      { rule: 'merge-duplicate-logic', verdict: 'ready' },
      { rule: 'common-override', verdict: 'failing-margins' },
      { rule: 'two-level-minimise', verdict: 'ready' },
    ],
    // One clear transistor steering through diodes leaves a cleared line near 1 V: an RTL input turns on at 0.5 V.
    refusedOnMargin: { rule: 'common-override', margin: 'diode-steered low level' },
    // With CLR and LD never together each bit's data gate needs one transistor fewer.
    onlyUnderAssumption: { rule: 'two-level-minimise' },
  },
  {
    file: 'wren8-bus-driver.cir',
    name: 'Wren-8 bus driver',
    family: 'dtl',
    level: 'transistor',
    board: { name: 'Bus card', parts: 54, areaMm2: 1400, cost: 2.1 },
    shows: [
      { rule: 'shared-control-driver', verdict: 'ready' },
      { rule: 'merge-duplicate-logic', verdict: 'ready' },
    ],
  },
  {
    file: 'wren8-decoder.cir',
    name: 'Wren-8 register-select decoder',
    family: 'cmos',
    level: 'transistor',
    shows: [{ rule: 'double-inversion', verdict: 'ready' }],
  },
  {
    file: 'wren8-data-bus.cir',
    name: 'Wren-8 data bus, bit 0',
    family: 'cmos',
    level: 'transistor',
    clockPeriodNs: 2000,
    assumption: {
      expression: '!(ENA & ENP) & !(ENA & ENM) & !(ENA & ENS) & !(ENP & ENM) & !(ENP & ENS) & !(ENM & ENS)',
      justification: 'One bus source at a time: the Wren-8 sequencer raises exactly one of the accumulator, program-counter, memory and switch strobes in each bus cycle (demo scenario).',
    },
    shows: [{ rule: 'tristate-slim', verdict: 'ready' }],
    onlyUnderAssumption: { rule: 'tristate-slim' },
  },
  {
    file: 'wren8-flag-register.cir',
    name: 'Wren-8 flag register',
    family: 'nmos',
    level: 'transistor',
    board: { name: 'Flag card', parts: 24, areaMm2: 500, cost: 0.8 },
    shows: [
      { rule: 'common-override', verdict: 'ready' },
      { rule: 'constant-input', verdict: 'ready' },
    ],
  },
  {
    file: 'wren8-output-port.cir',
    name: 'Wren-8 output port',
    family: 'rtl',
    level: 'transistor',
    // Joining the emitter nodes changes all four stacks: the scan compares Y0..Y3 before and after
    // (proved) and simulates the four stacks together for sneak paths; forced β and the stacked low
    // level only warn, so the shared switch is ready.
    shows: [{ rule: 'shared-enable-switch', verdict: 'ready' }],
  },
  {
    file: 'wren8-seven-segment.v',
    name: 'Wren-8 front-panel display decoder',
    family: 'gate',
    level: 'gate',
    assumption: {
      expression: '!(B3 & (B2 | B1))',
      justification: 'The displayed digit comes from a BCD counter that only holds 0-9, so codes 10-15 never reach the decoder (demo scenario).',
    },
    shows: [
      { rule: 'two-level-minimise', verdict: 'ready' },
      { rule: 'shared-control-driver', verdict: 'ready' },
      { rule: 'merge-duplicate-logic', verdict: 'ready' },
    ],
  },
  {
    file: 'wren8-alu-slice.v',
    name: 'Wren-8 ALU bit slice',
    family: 'gate',
    level: 'gate',
    shows: [
      { rule: 'constant-input', verdict: 'ready' },
      { rule: 'double-inversion', verdict: 'ready' },
      { rule: 'merge-duplicate-logic', verdict: 'ready' },
      { rule: 'two-level-minimise', verdict: 'ready' },
    ],
  },
];

/** The seed's two review decisions: accept a ready proposal, reject the one its margins refuse. */
export const DEMO_REVIEW = {
  accept: { file: 'wren8-register-slice.cir', rule: 'shared-control-driver' },
  reject: {
    file: 'wren8-register-slice.cir',
    rule: 'common-override',
    reason:
      'Steered through diodes, a cleared line would sit near 1 V, above the 0.5 V at which the RTL stages reading it turn on; keep the per-bit clear transistors (demo decision).',
  },
} as const;

export function demoDeck(file: string): Buffer {
  return fs.readFileSync(path.join(DEMO_DIR, file));
}

export async function seedWorkflow(db: Db, teamId: string): Promise<string[]> {
  if (await db.models.Design.count({ where: { teamId } })) return [];
  const designer = await db.models.User.findOne({ where: { email: 'designer@trimwire.test' } });
  const reviewer = await db.models.User.findOne({ where: { email: 'reviewer@trimwire.test' } });
  if (!designer || !reviewer) return [];
  const created: string[] = [];
  const designIds = new Map<string, string>();
  const minimiser = createEspressoMinimiser({ size: 1 });
  try {
    for (const d of DEMO_DESIGNS) {
      const design = await createDesign(db, designer, teamId, { buffer: demoDeck(d.file), name: d.file }, {
        name: d.name,
        family: d.family,
        ...(d.clockPeriodNs ? { clockPeriodNs: d.clockPeriodNs } : {}),
        ...(d.board ? { boardName: d.board.name, budgetParts: d.board.parts, budgetAreaMm2: d.board.areaMm2, budgetCost: d.board.cost } : {}),
        note: 'Demo design (invented for the Larkspur Relay Works scenario).',
      });
      if (d.assumption) await createAssumption(db, design, designer, d.assumption);
      const rev = await db.models.Revision.findOne({ where: { designId: design.id, number: 1 } });
      const scan = await db.models.Scan.create({ designId: design.id, revisionId: rev!.id, revisionNumber: 1, rules: null, startedBy: designer.id, engineVersion: ENGINE_VERSION });
      await runScan({ db, workerId: 'seed', minimiser, heartbeatTimeoutS: 120, maxAttempts: 3 }, scan.id);
      designIds.set(d.file, design.id);
      created.push(`design ${d.name}`);
    }
    // One ready proposal accepted, and one that its margins refuse rejected with the reason.
    const pick = async (file: string, rule: string, ready: boolean) => {
      const open = await db.models.Proposal.findAll({ where: { designId: designIds.get(file)!, ruleId: rule, status: 'open' }, order: [['savingsParts', 'DESC'], ['id', 'ASC']] });
      return open.find((p) => (p.readiness === 'ready') === ready);
    };
    const accept = await pick(DEMO_REVIEW.accept.file, DEMO_REVIEW.accept.rule, true);
    if (accept) await decide(db, accept.id, teamId, reviewer, { decision: 'accept' });
    const reject = await pick(DEMO_REVIEW.reject.file, DEMO_REVIEW.reject.rule, false);
    if (reject) await decide(db, reject.id, teamId, reviewer, { decision: 'reject', reason: DEMO_REVIEW.reject.reason });
  } finally {
    minimiser.close();
  }
  return created;
}
