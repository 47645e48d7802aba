// ngspice (Debian package, generic NPN IS=1e-14 BF=100) against shared-enable-switch: a ready
// rewrite keeps every output's logic level on every input combination and its sink current agrees
// with the operating point at the rule's corner within 15 %; a shared switch the rule marks
// failing (forced β) leaves the outputs high in ngspice where the per-bit switches pulled them low.
import { describe, expect, it } from 'vitest';
import { DEFAULT_MARGIN_SETTINGS as S } from '../margins/defaults';
import { NetlistBuilder } from '../netlist/build';
import type { FlatNetlist } from '../netlist/ir';
import { operatingPoints } from '@/tests/support/ngspice';
import { applied, atCorner, deckOf, levelTable, relativeDiff } from '@/tests/support/rule-levels';
import { sharedEnableSwitch } from './shared-enable-switch';
import { runOne } from './support/rule-test-kit';
import type { Rule } from './types';

const rule = sharedEnableSwitch as unknown as Rule;
// RTL input thresholds V_IL 0.5 V, V_IH 1.0 V (common practice; the margin defaults).
const RTL = S.thresholds.rtl;

function stacks(n: number, rc: number, rbe: number): FlatNetlist {
  const b = new NetlistBuilder('Wren-8 bus output stacks');
  b.rail('VCC', 5);
  b.model('QN', 'npn', { IS: 1e-14, BF: 100 });
  for (let k = 0; k < n; k++) {
    b.within([`XO${k}`], () => {
      b.resistor('RC', 'VCC', 'Y', rc);
      b.resistor('RD', `/D${k}`, 'BD', 4700);
      b.npn('QD', 'Y', 'BD', 'N');
      b.resistor('RE', '/EN', 'BE', rbe);
      b.npn('QE', 'N', 'BE', '0');
    });
  }
  return b.build();
}

describe('shared-enable-switch in ngspice', () => {
  it('a ready rewrite keeps every level, and its sink current matches the operating point within 15 %', async () => {
    const nl = stacks(3, 1000, 2200);
    const f = (await runOne(rule, nl)).findings[0];
    expect(f.messageId).toBe('share');
    const p = f.proposals[0];
    const inputs = ['EN', 'D0', 'D1', 'D2'];
    const nets = ['XO0.Y', 'XO1.Y', 'XO2.Y'];
    const before = levelTable(nl, { inputs, nets, high: 5, thresholds: RTL });
    const after = levelTable(applied(nl, p), { inputs, nets, high: 5, thresholds: RTL });
    expect(before.levels.flatMap(Object.values)).not.toContain('X');
    expect(after.levels).toEqual(before.levels);

    // Every output pulled low through the shared switch at the rule's worst corner.
    const sink = p.margins.find((m) => m.name === 'sink current')!;
    const corner = atCorner(applied(nl, p), sink.corner, { 'R_pull-up': nets.map((n) => n.replace('.Y', '.RC')) });
    const [row] = operatingPoints(deckOf(corner), { combinations: [{ EN: 5, D0: 5, D1: 5, D2: 5 }], probe: nets });
    const r = 1000 * (sink.corner.resistors.includes('R_pull-up +') ? 1.05 : 0.95);
    const simulated = nets.reduce((s, n) => s + (sink.corner.supply - row[n]) / r, 0);
    expect(relativeDiff(sink.value, simulated)).toBeLessThan(0.15);
  });

  it('the one-switch rewrite marked failing leaves the outputs high in ngspice', async () => {
    // Two 220 Ω outputs, 15k base resistors: one switch per bit saturates (I_B·β ≈ 29 mA > 22 mA),
    // one shared switch for 44 mA does not.
    const nl = stacks(2, 220, 15000);
    const f = (await runOne(rule, nl)).findings[0];
    expect(f.messageId).toBe('failing');
    const p = f.proposals[0];
    expect(p.margins.find((m) => m.name === 'forced β')!.status).toBe('fail');
    const inputs = ['EN', 'D0', 'D1'];
    const nets = ['XO0.Y', 'XO1.Y'];
    const all = { EN: 1, D0: 1, D1: 1 } as const;
    const before = levelTable(nl, { inputs, nets, high: 5, thresholds: RTL, points: [all] });
    const after = levelTable(applied(nl, p), { inputs, nets, high: 5, thresholds: RTL, points: [all] });
    expect(before.levels[0]).toEqual({ 'XO0.Y': 0, 'XO1.Y': 0 });
    expect(Object.values(after.levels[0])).not.toEqual([0, 0]);
  });
});
