// The edited design's view built incrementally must be the view a full extraction gives: checked on
// every proposal the rules make on their doc examples, the demo designs and generated bit-sliced boards.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readSpice } from '../formats/spice/read';
import { parseExpr } from '../logic/expr-parse';
import { flatten } from '../netlist/flatten';
import { generateBitSliced } from '../netlist/generate';
import type { FlatNetlist } from '../netlist/ir';
import { applyProposals } from '../rewrite/apply';
import { runRules } from '../rules/run-rules';
import type { Assumption } from '../rules/types';
import { extractLogic } from './index';
import { extractEdited } from './incremental';
import type { LogicView } from './types';

const RULES_DIR = join(__dirname, '../rules');
const DEMO_DIR = join(__dirname, '../../server/db/demo');

function netlistOf(deck: string): FlatNetlist {
  return flatten(readSpice(deck, 'example.cir').design);
}

/** `* assume: EXPR` or `* assume: ID EXPR`, as the two doc styles write them. */
function assumptionsIn(deck: string): Assumption[] {
  return [...deck.matchAll(/^\*\s*assume:\s*(.+)$/gim)].map((m, i) => {
    const text = m[1].trim();
    const withId = /^([A-Za-z]\w*)\s+(.+)$/.exec(text);
    try {
      return { id: `A${i + 1}`, text, expr: parseExpr(text) };
    } catch {
      return { id: withId![1], text: withId![2], expr: parseExpr(withId![2]) };
    }
  });
}

/** What the proofs read of a view: everything but the extractor's warnings. */
function comparable(view: LogicView) {
  const { diagnostics: _d, ...rest } = view;
  return { ...rest, nodes: view.nodes.map((n) => ({ ...n })), nodeByNet: [...view.nodeByNet], rails: [...view.rails] };
}

async function checkAll(nl: FlatNetlist, assumptions: Assumption[]): Promise<number> {
  const view = extractLogic(nl);
  const run = await runRules(nl, view, { assumptions });
  let checked = 0;
  for (const f of run.findings) {
    for (const p of f.proposals) {
      const after = applyProposals(nl, [p], { share: true });
      // every share allowed, so the incremental path runs even where most of a small design changes
      const edited = extractEdited({ nl, view }, after, p.edit, { maxChangedShare: 1 });
      expect(comparable(edited), `${f.ruleId} ${p.id}`).toEqual(comparable(extractLogic(after)));
      checked++;
    }
  }
  return checked;
}

describe('extractEdited', () => {
  const docs = readdirSync(RULES_DIR).filter((f) => f.endsWith('.md'));
  for (const doc of docs) {
    it(`equals a full extraction for every proposal on the examples of ${doc}`, async () => {
      const md = readFileSync(join(RULES_DIR, doc), 'utf8');
      let decks = 0;
      for (const m of md.matchAll(/```spice[^\n]*\n([\s\S]*?)```/g)) {
        await checkAll(netlistOf(m[1]), assumptionsIn(m[1]));
        decks++;
      }
      expect(decks).toBeGreaterThan(0);
    });
  }

  it('equals a full extraction on the demo designs', async () => {
    let checked = 0;
    for (const f of readdirSync(DEMO_DIR).filter((x) => x.endsWith('.cir'))) {
      const text = readFileSync(join(DEMO_DIR, f), 'utf8');
      checked += await checkAll(netlistOf(text), assumptionsIn(text));
    }
    expect(checked).toBeGreaterThan(0);
  });

  for (const family of ['rtl', 'cmos'] as const) {
    it(`equals a full extraction on a generated ${family} bit-sliced board`, async () => {
      const nl = flatten(generateBitSliced({ slices: 6, family }));
      expect(await checkAll(nl, [])).toBeGreaterThan(0);
    });
  }

  it('extracts the edited design whole when most of it changed, with the same result', async () => {
    const nl = flatten(generateBitSliced({ slices: 4, family: 'rtl' }));
    const view = extractLogic(nl);
    const run = await runRules(nl, view, {});
    const p = run.findings[0].proposals[0];
    const after = applyProposals(nl, [p], { share: true });
    const whole = extractEdited({ nl, view }, after, p.edit, { maxChangedShare: 0 });
    expect(whole.diagnostics).toEqual(extractLogic(after).diagnostics);
    expect(comparable(whole)).toEqual(comparable(extractEdited({ nl, view }, after, p.edit, { maxChangedShare: 1 })));
  });

  it('leaves the unedited view untouched', async () => {
    const nl = flatten(generateBitSliced({ slices: 4, family: 'rtl' }));
    const view = extractLogic(nl);
    const snapshot = JSON.stringify(comparable(view));
    const run = await runRules(nl, view, {});
    const p = run.findings[0].proposals[0];
    extractEdited({ nl, view }, applyProposals(nl, [p], { share: true }), p.edit, { maxChangedShare: 1 });
    expect(JSON.stringify(comparable(view))).toBe(snapshot);
  });
});
