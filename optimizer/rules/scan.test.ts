// Proves the scan pipeline's verdicts: a sound shared driver is proved and ready, the same rewrite
// past its fan-out limit is failing-margins, a wrong rewrite is refuted with a counterexample that
// distinguishes the designs, and an assumption-dependent rewrite is proved only under it.
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { evaluate } from '../logic/expr';
import { parseExpr } from '../logic/expr-parse';
import { fanOut } from '../margins/line';
import { NetlistBuilder } from '../netlist/build';
import { defineRule } from './define-rule';
import { checkEquivalence } from '../verify/equivalence';
import { scan, verifyProposal, type Verifier } from './scan';
import { scanOne } from './support/rule-test-kit';
import { sliceInverters } from './test-helpers';
import { tristateSlim } from './tristate-slim';
import { emptyEdit } from './types';

/** Test double of a sharing rule: keep slice 0's inverter, merge every other slice's output into it. */
const share = defineRule({
  id: 'test-share',
  meta: {
    description: 'share the first slice inverter',
    messages: { share: '{n} slices each invert {net}' },
    optionsSchema: z.object({ wrongInput: z.boolean() }),
    defaultOptions: { wrongInput: false },
  },
  find(ctx, options) {
    const qs = ctx.netlist.devices.filter((d) => d.kind === 'npn');
    const edit = emptyEdit();
    if (options.wrongInput) {
      edit.reconnect.push({ device: 'XS1.RB', terminal: 0, net: 'CLR' });
    } else {
      for (const q of qs.slice(1)) {
        const p = q.path.join('.');
        edit.removeDevices.push(`${p}.Q1`, `${p}.RC`, `${p}.RB`);
        edit.mergeNets.push({ keep: 'XS0.LDN', remove: `${p}.LDN` });
      }
    }
    ctx.report({
      messageId: 'share',
      data: { n: qs.length, net: 'LOAD' },
      location: { devices: qs.map((q) => q.name), nets: ['LOAD'] },
      proposals: [{ title: 'one shared inverter', edit, margins: [fanOut({ loads: qs.length, family: 'rtl' }, ctx.margins)] }],
    });
  },
});
const rules = { [share.id]: share };

describe('scan', () => {
  it('proves a shared driver and marks it ready when its margins pass', async () => {
    const r = await scan(sliceInverters(4), { rules });
    expect(r.ruleErrors).toEqual([]);
    const p = r.findings[0].proposals[0];
    expect(p.verification.status).toBe('proved');
    expect(p.verification.compared).toEqual(['XS0.LDN', 'XS1.LDN', 'XS2.LDN', 'XS3.LDN']);
    expect(p.savings).toMatchObject({ transistors: 3, resistors: 6 });
    expect(p.verdict).toBe('ready');
  });

  it('marks the same proved rewrite failing-margins past the RTL fan-out', async () => {
    // Mano (from memory): typical RTL fan-out 5 — eight loads on one driver fails.
    const r = await scan(sliceInverters(8), { rules });
    const p = r.findings[0].proposals[0];
    expect(p.verification.status).toBe('proved');
    expect(p.margins[0].status).toBe('fail');
    expect(p.verdict).toBe('failing-margins');
  });

  it('refutes a wrong rewrite with a counterexample that distinguishes the designs', async () => {
    const r = await scan(sliceInverters(2), { rules, ruleOptions: { 'test-share': { wrongInput: true } } });
    const p = r.findings[0].proposals[0];
    expect(p.verdict).toBe('refuted');
    const cex = p.verification.counterexample!;
    expect(cex.LOAD).not.toBe(cex.CLR);
    expect(p.verification.differing?.map((d) => d.name)).toEqual(['XS1.LDN']);
  });

  it('proves an assumption-dependent rewrite only under the assumption it names', async () => {
    // Two CMOS-free gate-level slices: Y = !(A & B) rewritten to Y = !A, valid only while A -> B.
    const build = () => {
      const b = new NetlistBuilder('Wren-8 flag gate');
      b.gate('G1', 'nand', ['Y', 'A', 'B']);
      return b.build();
    };
    const assumeRule = (ids: string[]) =>
      defineRule({
        id: 'test-assume',
        meta: { description: '', messages: { m: 'drop B' }, optionsSchema: z.object({}), defaultOptions: {} },
        find(ctx) {
          ctx.report({
            messageId: 'm',
            location: { devices: ['G1'] },
            proposals: [{ title: 'drop B', assumptions: ids, edit: { ...emptyEdit(), removeDevices: ['G1'], addDevices: [{ name: 'G1N', kind: 'gate', op: 'not', terminals: ['Y', 'A'] }] } }],
          });
        },
      });
    const assumptions = [{ id: 'A1', text: 'A -> B', expr: parseExpr('A -> B') }];
    const withIt = await scan(build(), { rules: { 'test-assume': assumeRule(['A1']) }, assumptions });
    expect(withIt.findings[0].proposals[0].verification).toMatchObject({ status: 'proved', assumptions: ['A1'] });
    expect(withIt.findings[0].proposals[0].savings.gates).toBe(0);
    const without = await scan(build(), { rules: { 'test-assume': assumeRule([]) }, assumptions });
    const v = without.findings[0].proposals[0].verification;
    expect(v.status).toBe('refuted');
    expect(evaluate(assumptions[0].expr, v.counterexample!)).toBe(0);
  });

  it('catches contention a logic proof missed with the switch-level check', async () => {
    // Two gate-level inverters of different inputs merged onto one net. A verifier that wrongly
    // says "proved" stands in for a proof that cannot see drive strength.
    const b = new NetlistBuilder('Wren-8 bus, two drivers');
    b.gate('U1', 'not', ['Y1', 'A']);
    b.gate('U2', 'not', ['Y2', 'B']);
    const merge = defineRule({
      id: 'test-merge',
      meta: { description: '', messages: { m: 'merge' }, optionsSchema: z.object({}), defaultOptions: {} },
      find(ctx) {
        ctx.report({ messageId: 'm', location: {}, proposals: [{ title: 'merge', edit: { ...emptyEdit(), mergeNets: [{ keep: 'Y1', remove: 'Y2' }] } }] });
      },
    });
    const r = await scan(b.build(), {
      rules: { 'test-merge': merge },
      verifier: (before) => ({ verdict: 'proved', method: 'exhaustive', assumptionsUsed: [], inputs: Object.keys(before) }),
    });
    const v = r.findings[0].proposals[0].verification;
    expect(v.status).toBe('refuted');
    expect(v.method).toBe('switch-level');
    expect(v.counterexample!.A).not.toBe(v.counterexample!.B);
    expect(v.note).toMatch(/driven both ways/);
  });

  describe('tri-state lines are compared only where some stage drives them', () => {
    /** Wren-8 data bus of two slices, each a CMOS tri-state inverter of D_k enabled by EN_k. */
    const bus = () => {
      const b = new NetlistBuilder('Wren-8 data bus').rail('VDD', 5);
      for (let k = 0; k < 2; k++) {
        b.within([`XB${k}`], () => {
          b.pmos('PI', 'ENB', `/EN${k}`, 'VDD', { bulk: 'VDD' }).nmos('NI', 'ENB', `/EN${k}`, '0');
          b.pmos('P1', 'M1', `/D${k}`, 'VDD', { bulk: 'VDD' }).pmos('P2', '/BUS', 'ENB', 'M1', { bulk: 'VDD' });
          b.nmos('N2', '/BUS', `/EN${k}`, 'M2').nmos('N1', 'M2', `/D${k}`, '0');
        });
      }
      return b.pmos('PR', 'Q', 'BUS', 'VDD', { bulk: 'VDD' }).nmos('NR', 'Q', 'BUS', '0').build();
    };

    it('proves tristate-slim under an at-most-one-enabled assumption (the idle line is not compared)', async () => {
      const s = await scanOne(tristateSlim, bus(), { assumptions: ['!(EN0 & EN1)'] });
      const p = s.findings[0].proposals[0];
      expect(p.verification.status).toBe('proved');
      expect(p.verification.assumptions).toEqual(['A1']);
      expect(p.verification.compared).toContain('BUS');
      expect(p.verdict).not.toBe('refuted');
    });

    it('still refutes it when both stages may drive, with both enables on in the counterexample', async () => {
      const s = await scanOne(tristateSlim, bus());
      const v = s.findings[0].proposals[0].verification;
      expect(v.status).toBe('refuted');
      expect([v.counterexample!.EN0, v.counterexample!.EN1]).toEqual([1, 1]);
    });
  });

  describe('proofs are shared between slices whose regions are the same circuit', () => {
    /** Test double: one proposal per slice, either a like-for-like base resistor or a wrong input. */
    const perSlice = defineRule({
      id: 'test-per-slice',
      meta: {
        description: 'one edit in every slice',
        messages: { m: 'slice {path}' },
        optionsSchema: z.object({ wrongInput: z.boolean() }),
        defaultOptions: { wrongInput: false },
      },
      find(ctx, options) {
        for (const q of ctx.netlist.devices.filter((d) => d.kind === 'npn')) {
          const p = q.path.join('.');
          const edit = emptyEdit();
          if (options.wrongInput) edit.reconnect.push({ device: `${p}.RB`, terminal: 0, net: 'CLR' });
          else {
            edit.removeDevices.push(`${p}.RB`);
            edit.addDevices.push({ name: `${p}.RB2`, kind: 'resistor', terminals: ['LOAD', `${p}.B`], value: 4700, path: q.path });
          }
          ctx.report({ messageId: 'm', data: { path: p }, location: { devices: [q.name] }, proposals: [{ title: 'edit', edit }] });
        }
      },
    });
    const counting = () => {
      const calls = { n: 0 };
      const verifier: Verifier = (before, after, assumptions) => {
        calls.n++;
        return checkEquivalence(before, after, { assumptions: assumptions.map((a) => ({ name: a.id, expr: a.expr })) });
      };
      return { calls, verifier };
    };

    it('proves the first slice and reuses the verdict, each in its own slice\'s names', async () => {
      const nl = sliceInverters(6);
      const { calls, verifier } = counting();
      const r = await scan(nl, { rules: { [perSlice.id]: perSlice }, verifier });
      expect(r.findings).toHaveLength(6);
      expect(calls.n).toBe(1);
      r.findings.forEach((f, k) => {
        const v = f.proposals[0].verification;
        expect(v.status).toBe('proved');
        expect(v.compared).toContain(`XS${k}.LDN`);
        // the same verdict a proof of its own gives (uncached)
        expect(v).toEqual(verifyProposal({ nl, view: r.view }, f.proposals[0].proposal, [], verifier));
      });
      expect(calls.n).toBe(7);
    });

    it('maps a cached counterexample to each slice and re-simulates it there', async () => {
      const nl = sliceInverters(5);
      const { calls, verifier } = counting();
      const r = await scan(nl, { rules: { [perSlice.id]: perSlice }, ruleOptions: { [perSlice.id]: { wrongInput: true } }, verifier });
      expect(calls.n).toBe(1);
      r.findings.forEach((f, k) => {
        const v = f.proposals[0].verification;
        expect(v.status).toBe('refuted');
        expect(v.differing?.map((d) => d.name)).toEqual([`XS${k}.LDN`]);
        expect(v.counterexample!.LOAD).not.toBe(v.counterexample!.CLR);
        expect(v).toEqual(verifyProposal({ nl, view: r.view }, f.proposals[0].proposal, [], verifier));
      });
    });

    it('proves again where one slice differs (a different collector resistor)', async () => {
      const b = new NetlistBuilder('Wren-8 load strobe inverters, one slice rebuilt');
      b.rail('VCC', 5);
      b.model('QN', 'npn', { IS: 1e-14, BF: 100 });
      for (let k = 0; k < 4; k++) {
        b.within([`XS${k}`], () => {
          b.resistor('RC', 'VCC', 'LDN', k === 2 ? 2200 : 1000);
          b.resistor('RB', '/LOAD', 'B', 4700);
          b.npn('Q1', 'LDN', 'B', '0', { model: 'QN' });
        });
      }
      const { calls, verifier } = counting();
      const r = await scan(b.build(), { rules: { [perSlice.id]: perSlice }, verifier });
      expect(r.findings.map((f) => f.proposals[0].verification.status)).toEqual(['proved', 'proved', 'proved', 'proved']);
      expect(calls.n).toBe(2);
    });
  });
});
