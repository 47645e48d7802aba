// A small deck for a rule, taken from its doc's fenced SPICE examples (the same reader the rule
// tests use): the first example that expects a finding, with the assumptions and clock period it
// states, so an end-to-end test can upload it like any design.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { deckExamples, docExamples } from '@/optimizer/rules/support/rule-test-kit';

export interface RuleDeck {
  ruleId: string;
  /** The deck's title line. */
  label: string;
  deck: string;
  /** Assumption expressions the example states. */
  assumptions: string[];
  clockPeriodNs?: number;
}

/**
 * Rule docs use one of two example styles: fences tagged `name=… findings=…` (assumptions as
 * `* assume: EXPR`) or plain fences with `* expect: …` and `* assume: ID EXPR` cards.
 */
export function ruleDeck(root: string, ruleId: string): RuleDeck {
  const mdPath = path.join(root, 'optimizer/rules', `${ruleId}.md`);
  const md = readFileSync(mdPath, 'utf8');
  if (/```spice[ \t]+\S/.test(md)) {
    const tagged = docExamples(md).find((e) => e.findings > 0);
    if (!tagged) throw new Error(`${mdPath}: no example that expects a finding`);
    return {
      ruleId,
      label: tagged.deck.split('\n')[0]!.trim(),
      deck: tagged.deck,
      assumptions: tagged.assumptions,
      ...(tagged.clockPeriod ? { clockPeriodNs: Math.round(tagged.clockPeriod * 1e12) / 1e3 } : {}),
    };
  }
  const plain = deckExamples(mdPath).find((e) => e.expect.messageId !== null);
  if (!plain) throw new Error(`${mdPath}: no example that expects a finding`);
  return { ruleId, label: plain.label, deck: plain.deck, assumptions: plain.assumptions.map((a) => a.text) };
}
