// The Wren-8 demo set proves what DEMO_DESIGNS says it shows: every design scanned as the seed
// scans it (its family, assumption and clock; all rules; the Espresso pool) gives each listed
// (rule, verdict); the set covers the whole rule catalogue with ≥ 5 transistor-level and ≥ 2
// gate-level designs; the margins-refused rewrite fails the named margin; the assumption-only
// rewrite is proved with its assumption and refuted or absent without it; every file passes `check`.
import { afterAll, describe, expect, it } from 'vitest';
import path from 'node:path';
import { flatten, readDesign } from '@/optimizer';
import { runCli, type CliIo } from '@/optimizer/cli';
import { extractLogic } from '@/optimizer/extract';
import { createEspressoMinimiser } from '@/optimizer/logic/espresso/espresso-minimiser';
import { parseExpr } from '@/optimizer/logic/expr-parse';
import type { MapFamily } from '@/optimizer/logic/family-parts';
import { RULES } from '@/optimizer/rules';
import { scan, type ScannedFinding, type ScanResult } from '@/optimizer/rules/scan';
import { DEMO_DESIGNS, DEMO_REVIEW, demoDeck, type DemoDesign } from '@/server/db/seed-workflow';

const minimiser = createEspressoMinimiser({ size: 1 });
afterAll(() => minimiser.close());

/** The seed's scan of a design (engine-thread.ts does the same steps), with or without its assumption. */
async function scanDemo(d: DemoDesign, withAssumption = true): Promise<ScanResult> {
  const { design } = readDesign(demoDeck(d.file).toString('utf8'), { file: d.file });
  const flat = flatten(design);
  const assumptions = withAssumption && d.assumption ? [{ id: 'A1', text: d.assumption.expression, expr: parseExpr(d.assumption.expression, 'assumption A1') }] : [];
  return scan(flat, {
    view: extractLogic(flat),
    assumptions,
    minimiser,
    targetFamily: d.family as MapFamily,
    ...(d.clockPeriodNs ? { clockPeriod: d.clockPeriodNs * 1e-9 } : {}),
  });
}

const seen = new Map<string, Promise<ScanResult>>();
const scanned = (d: DemoDesign) => {
  if (!seen.has(d.file)) seen.set(d.file, scanDemo(d));
  return seen.get(d.file)!;
};

const verdicts = (fs: ScannedFinding[], rule: string) => fs.filter((f) => f.finding.ruleId === rule).flatMap((f) => f.proposals.map((p) => p.verdict));

describe('Wren-8 demo designs', () => {
  it('has at least five transistor-level designs (RTL, DTL, CMOS among them) and two gate-level ones', () => {
    const transistor = DEMO_DESIGNS.filter((d) => d.level === 'transistor');
    const gate = DEMO_DESIGNS.filter((d) => d.level === 'gate');
    expect(transistor.length).toBeGreaterThanOrEqual(5);
    expect(gate.length).toBeGreaterThanOrEqual(2);
    const families = transistor.map((d) => d.family);
    for (const f of ['rtl', 'dtl', 'cmos', 'nmos']) expect(families).toContain(f);
    for (const d of transistor) expect(path.extname(d.file), d.file).toBe('.cir');
    for (const d of gate) expect(path.extname(d.file), d.file).toBe('.v');
  });

  it('lists every rule of the catalogue among what the designs show', () => {
    const shown = new Set(DEMO_DESIGNS.flatMap((d) => d.shows.map((s) => s.rule)));
    expect([...shown].sort()).toEqual(Object.keys(RULES).sort());
  });

  it.each(DEMO_DESIGNS.map((d) => [d.file, d] as const))('%s passes check with no errors', (file) => {
    const out: string[] = [];
    const err: string[] = [];
    const io: CliIo = { readFile: () => demoDeck(file), writeFile: () => undefined, stdout: (t) => out.push(t), stderr: (t) => err.push(t) };
    expect(runCli(['check', file], io)).toBe(0);
    expect(err.join('')).not.toMatch(/error/i);
    expect(out.join('')).toMatch(/: ok \(/);
  });

  it.each(DEMO_DESIGNS.map((d) => [d.file, d] as const))('%s shows each rule it lists, with its verdict, and no rule errors', async (_file, d) => {
    const r = await scanned(d);
    expect(r.ruleErrors).toEqual([]);
    for (const s of d.shows) expect(verdicts(r.findings, s.rule), `${s.rule} in ${d.file}`).toContain(s.verdict);
  });

  it('refuses the attractive rewrite of the margins design on the named margin', async () => {
    const designs = DEMO_DESIGNS.filter((d) => d.refusedOnMargin);
    expect(designs.length).toBeGreaterThanOrEqual(1);
    for (const d of designs) {
      const { rule, margin } = d.refusedOnMargin!;
      expect(margin).toBe('diode-steered low level'); // the Wren-8 register slice's refusal (see its deck)
      const refused = (await scanned(d)).findings.filter((f) => f.finding.ruleId === rule).flatMap((f) => f.proposals).filter((p) => p.verdict === 'failing-margins');
      expect(refused.length).toBeGreaterThan(0);
      for (const p of refused) {
        expect(p.verification.status).toBe('proved'); // logically right, electrically refused
        const m = p.margins.find((x) => x.name === margin)!;
        expect(m.status).toBe('fail');
        // An RTL input turns on near 0.5 V (common practice); a diode-steered line sits ≈ V_CE(sat) + V_D above ground.
        expect(m.value).toBeGreaterThan(m.limit);
      }
    }
  });

  it('proves the assumption-only rewrites with their assumption, and refutes or drops them without it', async () => {
    const designs = DEMO_DESIGNS.filter((d) => d.onlyUnderAssumption);
    expect(designs.length).toBeGreaterThanOrEqual(1);
    for (const d of designs) {
      expect(d.assumption, d.file).toBeDefined();
      const rule = d.onlyUnderAssumption!.rule;
      const withIt = (await scanned(d)).findings.filter((f) => f.finding.ruleId === rule).flatMap((f) => f.proposals);
      expect(withIt.length, d.file).toBeGreaterThan(0);
      for (const p of withIt) {
        expect(p.verification.status, d.file).toBe('proved');
        expect(p.verification.assumptions, d.file).toEqual(['A1']);
        expect(p.proposal.assumptions, d.file).toEqual(['A1']);
      }
      const without = (await scanDemo(d, false)).findings.filter((f) => f.finding.ruleId === rule).flatMap((f) => f.proposals);
      for (const p of without) expect(p.verification.status, d.file).toBe('refuted');
    }
  });

  it('minimises the display decoder with codes 10-15 as don\'t-cares: fewer gates than without them', async () => {
    const d = DEMO_DESIGNS.find((x) => x.file === 'wren8-seven-segment.v')!;
    const saved = (r: ScanResult) =>
      new Map(r.findings.filter((f) => f.finding.ruleId === 'two-level-minimise').flatMap((f) => f.proposals.map((p) => [p.proposal.title, p] as const)));
    const withIt = saved(await scanned(d));
    const without = saved(await scanDemo(d, false));
    expect(withIt.size).toBe(7); // one block per segment a..g
    let more = 0;
    for (const p of withIt.values()) {
      expect(p.verification.assumptions).toEqual(['A1']);
      more += p.savings.gates ?? 0;
    }
    let fewer = 0;
    for (const p of without.values()) fewer += p.savings.gates ?? 0;
    expect(more).toBeGreaterThan(fewer);
  });

  it("decides proposals the seed can find: a ready one to accept and a refused one to reject", async () => {
    const byFile = (file: string) => DEMO_DESIGNS.find((d) => d.file === file)!;
    const acc = verdicts((await scanned(byFile(DEMO_REVIEW.accept.file))).findings, DEMO_REVIEW.accept.rule);
    expect(acc).toContain('ready');
    const rej = verdicts((await scanned(byFile(DEMO_REVIEW.reject.file))).findings, DEMO_REVIEW.reject.rule);
    expect(rej.some((v) => v !== 'ready')).toBe(true);
  });
});
