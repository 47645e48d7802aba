// Test kit for the sharing rules (shared-control-driver, shared-enable-switch, common-override):
// run one rule on a netlist or a flattened SPICE-style deck, read a rule doc's fenced deck examples
// with their `* expect:` lines, and compare the part-count change of a proposal with its savings.
import { readFileSync } from 'node:fs';
import { editSavings } from '../../cost/cost';
import { extractLogic } from '../../extract';
import { readSpice } from '../../formats/spice/read';
import { parseExpr } from '../../logic/expr-parse';
import { marginSettings, type MarginSettings } from '../../margins/defaults';
import { countFlat } from '../../netlist/counts';
import { flatten } from '../../netlist/flatten';
import type { FlatNetlist } from '../../netlist/ir';
import { applyProposals } from '../../rewrite/apply';
import { runRules, type RunResult } from '../run-rules';
import type { Assumption, Proposal, Rule } from '../types';

export function deckToFlat(text: string, file = 'example.cir'): FlatNetlist {
  const { design, diagnostics } = readSpice(text, file);
  const errors = diagnostics.filter((d) => d.severity === 'error');
  if (errors.length) throw new Error(`${file}: ${errors.map((e) => e.message).join('; ')}`);
  return flatten(design);
}

export function assumption(id: string, text: string): Assumption {
  return { id, text, expr: parseExpr(text) };
}

export async function runOne(
  rule: Rule,
  nl: FlatNetlist,
  options: { ruleOptions?: unknown; assumptions?: Assumption[]; margins?: Partial<MarginSettings> } = {},
): Promise<RunResult> {
  const view = extractLogic(nl);
  return runRules(nl, view, {
    rules: { [rule.id]: rule },
    ...(options.ruleOptions ? { ruleOptions: { [rule.id]: options.ruleOptions } } : {}),
    assumptions: options.assumptions ?? [],
    margins: marginSettings(options.margins ?? {}),
  });
}

export interface DeckExample {
  /** The deck's title line, as a label. */
  label: string;
  deck: string;
  /** From `* expect: none` or `* expect: <messageId> key=value …`. */
  expect: { messageId: string | null; data: Record<string, string> };
  /** `* assume: ID EXPR` lines. */
  assumptions: Assumption[];
}

/** Every ```spice block of a rule doc, with its expectation. */
export function deckExamples(mdPath: string): DeckExample[] {
  const md = readFileSync(mdPath, 'utf8');
  const out: DeckExample[] = [];
  for (const m of md.matchAll(/```spice\n([\s\S]*?)```/g)) {
    const deck = m[1];
    const expectLine = /^\*\s*expect:\s*(.+)$/m.exec(deck);
    if (!expectLine) throw new Error(`${mdPath}: a spice example lacks a "* expect:" line`);
    const [head, ...pairs] = expectLine[1].trim().split(/\s+/);
    const data = Object.fromEntries(pairs.map((p) => p.split('=') as [string, string]));
    const assumptions = [...deck.matchAll(/^\*\s*assume:\s*(\S+)\s+(.+)$/gm)].map((a) => assumption(a[1], a[2].trim()));
    out.push({ label: deck.split('\n')[0].trim(), deck, expect: { messageId: head === 'none' ? null : head, data }, assumptions });
  }
  return out;
}

/** Part counts after applying `proposal` minus before, against the savings the edit states. */
export function countDelta(nl: FlatNetlist, proposal: Proposal): { actual: Record<string, number>; stated: Record<string, number> } {
  const before = countFlat(nl);
  const after = countFlat(applyProposals(nl, [proposal]));
  const s = editSavings(nl, proposal.edit);
  return {
    actual: { transistors: before.transistors - after.transistors, resistors: before.resistors - after.resistors, diodes: before.diodes - after.diodes },
    stated: { transistors: s.transistors, resistors: s.resistors, diodes: s.diodes },
  };
}
