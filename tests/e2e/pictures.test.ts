// Pictures in Chromium: for a proposal of each rule (from the demo decks, or for rules they do not
// exercise, from a deck in the rule's doc examples, uploaded with the assumptions and clock it
// states), the proposal page draws
// the changed region before and after (one symbol per part of the region, as the API reports it),
// charts the margins and shows before/after waveforms; the design overview shows its charts.
// Screenshots at phone and wide sizes go to tests/e2e/screenshots/<screen>-<role>-<size>.png.
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createEspressoMinimiser } from '@/optimizer/logic/espresso/espresso-minimiser';
import { DEMO_DESIGNS } from '@/server/db/seed-workflow';
import { ENGINE_VERSION } from '@/server/features/designs/engine';
import { createAssumption } from '@/server/features/assumptions/service';
import { createDesign } from '@/server/features/designs/service';
import { runScan } from '@/server/jobs/run-scan';
import type { ProposalRegion } from '@/shared/api/pictures';
import { DEMO_PASSWORD, screenshot, signIn, startE2e, type E2e, type SizeName } from './harness';
import { ruleDeck } from './rule-examples';

const ROOT = path.resolve(__dirname, '../..');
let e2e: E2e;
/** One proposal id per rule, and a design that has proposals. */
const byRule = new Map<string, string>();
let designId = '';
/** Rules the demo decks do not exercise: each gets a deck from its doc's first finding example. */
const EXAMPLE_RULES = ['two-level-minimise', 'tristate-slim', 'constant-input', 'shared-enable-switch'];
const demoRules = new Set<string>();

beforeAll(async () => {
  e2e = await startE2e();
  const { db } = e2e.server;
  const designer = (await db.models.User.findOne({ where: { email: 'designer@trimwire.test' } }))!;
  const membership = (await db.models.Membership.findOne({ where: { userId: designer.id } }))!;
  const minimiser = createEspressoMinimiser({ size: 1 });
  try {
    const stamp = Date.now().toString(36);
    const scanDesign = async (designId: string) => {
      const rev = (await db.models.Revision.findOne({ where: { designId } }))!;
      const scan = await db.models.Scan.create({ designId, revisionId: rev.id, revisionNumber: 1, rules: null, startedBy: designer.id, engineVersion: ENGINE_VERSION });
      await runScan({ db, workerId: 'pictures-e2e', minimiser, heartbeatTimeoutS: 120, maxAttempts: 1 }, scan.id);
      return db.models.Proposal.findAll({ where: { designId }, order: [['savingsParts', 'DESC']] });
    };
    for (const d of DEMO_DESIGNS) {
      const buffer = fs.readFileSync(path.join(ROOT, 'server/db/demo', d.file));
      const design = await createDesign(db, designer, membership.teamId, { buffer, name: d.file }, {
        name: `${d.name} (pictures ${stamp})`,
        family: d.family,
        ...(d.clockPeriodNs ? { clockPeriodNs: d.clockPeriodNs } : {}),
      });
      // With its assumption, as the seed loads it (the data bus's rewrite is proved only under it).
      if (d.assumption) await createAssumption(db, design, designer, d.assumption);
      const proposals = await scanDesign(design.id);
      for (const p of proposals) if (!byRule.has(p.ruleId)) byRule.set(p.ruleId, p.id);
      if (proposals.length && !designId) designId = design.id;
    }
    for (const r of byRule.keys()) demoRules.add(r);
    for (const ruleId of EXAMPLE_RULES) {
      if (byRule.has(ruleId)) continue;
      // The doc example's deck, uploaded as a design with the assumptions and clock it states.
      const ex = ruleDeck(ROOT, ruleId);
      const file = `${ruleId}-example.cir`;
      const design = await createDesign(db, designer, membership.teamId, { buffer: Buffer.from(ex.deck), name: file }, {
        name: `${ex.label} (pictures ${stamp})`,
        ...(ex.clockPeriodNs ? { clockPeriodNs: ex.clockPeriodNs } : {}),
      });
      for (const expression of ex.assumptions) {
        await createAssumption(db, design, designer, { expression, justification: `Stated by the ${ruleId} rule's documented example.` });
      }
      const proposal = (await scanDesign(design.id)).find((p) => p.ruleId === ruleId);
      if (proposal) byRule.set(ruleId, proposal.id);
    }
  } finally {
    await minimiser.close?.();
  }
});

afterAll(async () => {
  await e2e?.stop();
});

describe('pictures', () => {
  it('the demo decks give proposals to draw', () => {
    expect(demoRules.size).toBeGreaterThan(0);
  });

  it("every rule has a proposal to draw, from the demo decks or the rule's documented example", () => {
    expect([...byRule.keys()].sort()).toEqual([...new Set([...demoRules, ...EXAMPLE_RULES])].sort());
  });

  for (const size of ['phone', 'wide'] as SizeName[]) {
    it(`draws each rule's proposal before and after, with margins and waveforms (${size})`, async () => {
      const { page, context } = await e2e.newPage(size);
      try {
        await signIn(page, 'reviewer@trimwire.test', DEMO_PASSWORD);
        await page.getByTestId('bench-screen').waitFor();
        for (const [ruleId, id] of byRule) {
          const region = (await (await page.request.get(`/api/proposals/${id}/region`)).json()) as ProposalRegion;
          await page.goto(`/proposals/${id}`);
          const before = page.getByTestId('region-drawing-before-svg');
          const after = page.getByTestId('region-drawing-after-svg');
          await before.waitFor();
          await after.waitFor();
          // One symbol per part of the region, and the highlighted ones are the edit's.
          expect(await before.locator('[data-part]').count()).toBe(region.before.parts.length);
          expect(await after.locator('[data-part]').count()).toBe(region.after.parts.length);
          const removed = await before.locator('[data-role="removed"]').evaluateAll((els) => els.map((e) => e.getAttribute('data-part')));
          expect(removed.sort()).toEqual([...region.removed].sort());
          const added = await after.locator('[data-role="added"]').evaluateAll((els) => els.map((e) => e.getAttribute('data-part')));
          expect(added.sort()).toEqual([...region.added].sort());
          await page.getByTestId('proposal-drawing').scrollIntoViewIfNeeded();
          await screenshot(page, `drawing-${ruleId}`, 'reviewer', size);
          await page.getByTestId('waveforms-svg').waitFor();
          await page.getByTestId('proposal-waveforms').scrollIntoViewIfNeeded();
          await screenshot(page, `waveforms-${ruleId}`, 'reviewer', size);
        }
        await page.goto(`/designs/${designId}`);
        await page.getByTestId('design-charts').waitFor();
        await page.getByTestId('design-charts').scrollIntoViewIfNeeded();
        await screenshot(page, 'charts', 'reviewer', size);
      } finally {
        await context.close();
      }
    });
  }
});
