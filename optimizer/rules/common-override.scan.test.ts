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

describe('common-override: scan verdicts of the doc examples (default options)', () => {
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

/** Wren-8 status bits whose lines each have a diode onto ANY ("some bit is high", bled to ground). */
function diodeOrDeck(bits: number, reader: 'rtl' | 'dtl'): string {
  const readerCards =
    reader === 'dtl'
      ? ['RP VCC P 4.7k', 'DI P Y DN', 'DL1 P M DN', 'DL2 M BR DN', 'RBL BR 0 5k']
      : ['RR Y BR 4.7k'];
  return [
    'Wren-8 status bits with a some-bit-high node',
    '.subckt SBIT D CLR ANY Z VCC',
    'RC VCC Y 1k',
    'DZ Y ANY DN',
    'RD D BD 4.7k',
    'QD Y BD 0 QN',
    'RK CLR BK 2.2k',
    'QK Y BK 0 QN',
    ...readerCards,
    'RZ VCC Z 2k',
    'QR Z BR 0 QN',
    '.ends',
    'VCC VCC 0 DC 5',
    'RANY ANY 0 10k',
    ...Array.from({ length: bits }, (_, k) => `XS${k} D${k} CLR ANY Z${k} VCC SBIT`),
    '.model QN NPN (IS=1e-14 BF=100)',
    '.model DN D (IS=1e-14)',
    '.end',
    '',
  ].join('\n');
}

describe('common-override: scan of an override on a diode-OR node the lines share', () => {
  it.each([
    ['rtl', 'failing-margins'],
    ['dtl', 'ready'],
  ] as const)('%s readers', async (reader, verdict) => {
    const r = await scanOne(rule, deckNetlist(diodeOrDeck(3, reader)), { options: { sharedNode: true } });
    expect(r.ruleErrors).toEqual([]);
    expect(r.findings).toHaveLength(1);
    expect(r.findings[0].finding.data).toMatchObject({ node: 'ANY', via: 'diode' });
    const p = r.findings[0].proposals[0];
    expect(p.verification.status).toBe('proved');
    expect(p.verdict).toBe(verdict);
  });
});

/**
 * Three NMOS bits of the Wren-8 accumulator, each read by a CMOS inverter: each line's 47k pull-up
 * hangs from S (pulled up by 4.7k), or each line has its own 47k pull-up and a diode onto ANY.
 */
function nmosSharedDeck(via: 'pull-up' | 'diode'): string {
  return [
    'Wren-8 NMOS accumulator bits on a shared node',
    '.subckt NBIT D CLR S ANY Z VCC',
    via === 'pull-up' ? 'RL S Y 47k' : 'RL VCC Y 47k',
    ...(via === 'diode' ? ['DZ Y ANY DN'] : []),
    'MD Y D 0 0 NE W=20u L=10u',
    'MK Y CLR 0 0 NE W=100u L=10u',
    'MRP Z Y VCC VCC PE W=20u L=10u',
    'MRN Z Y 0 0 NE W=10u L=10u',
    '.ends',
    'VCC VCC 0 DC 5',
    via === 'pull-up' ? 'RS VCC S 4.7k' : 'RANY ANY 0 100k',
    ...[0, 1, 2].map((k) => `XN${k} D${k} CLR S ANY Z${k} VCC NBIT`),
    '.model NE NMOS (LEVEL=1 VTO=0.8 KP=2e-5)',
    '.model PE PMOS (LEVEL=1 VTO=-0.8 KP=1e-5)',
    '.model DN D (IS=1e-14)',
    '.end',
    '',
  ].join('\n');
}

describe('common-override: scan of an NMOS override on a node the lines share', () => {
  it.each([
    ['pull-up', 'S'],
    ['diode', 'ANY'],
  ] as const)('via %s: the rewritten lines extract to the same functions', async (via, node) => {
    const r = await scanOne(rule, deckNetlist(nmosSharedDeck(via)), { options: { sharedNode: true, mosLines: true } });
    expect(r.ruleErrors).toEqual([]);
    expect(r.findings).toHaveLength(1);
    expect(r.findings[0].finding.data).toMatchObject({ node, via });
    expect(r.findings[0].proposals[0].verification.status).toBe('proved');
    // a 100 µm NMOS holds the node near ground and a CMOS input draws nothing: every margin passes
    expect(r.findings[0].proposals[0].verdict).toBe('ready');
  });
});
