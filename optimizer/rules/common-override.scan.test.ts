// common-override through the whole scan: each doc example is extracted, proposed, proved by
// extracting the rewritten region, and given the verdict its `* expect:` line implies.
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { commonOverride } from './common-override';
import { deckExamples, deckNetlist, scanOne } from './support/rule-test-kit';
import type { Rule } from './types';

const rule = commonOverride as unknown as Rule;
const examples = deckExamples(path.join(__dirname, 'common-override.md'));

/** The verdict a doc example's expected message implies: share forms are ready, failing forms fail on margins. */
const VERDICT: Record<string, string> = { share: 'ready', shareNode: 'ready', failing: 'failing-margins', failingNode: 'failing-margins' };

describe('common-override: scan verdicts of the doc examples', () => {
  it.each(examples.filter((e) => e.expect.messageId !== null).map((e) => [e.label, e] as const))('%s', async (_l, ex) => {
    const r = await scanOne(rule, deckNetlist(ex.deck), { assumptions: ex.assumptions, ...(ex.options ? { options: ex.options } : {}) });
    expect(r.ruleErrors).toEqual([]);
    expect(r.findings).toHaveLength(1);
    for (const p of r.findings[0].proposals) {
      expect({ status: p.verification.status, note: p.verification.note, counterexample: p.verification.counterexample }).toMatchObject({ status: 'proved' });
      expect(p.verdict).toBe(VERDICT[ex.expect.messageId!]);
    }
  });
});
