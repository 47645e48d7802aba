// Property tests of the scan on random small designs: every proposal it marks proved, applied to
// the design, keeps every surviving net's logic level on every input combination (checked by
// switch-level simulation, which does not use the extractor the proof stands on), and changes the
// part counts by exactly the savings it states. Run twice: proved whole, and proved part by part.
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { createEspressoMinimiser } from '../logic/espresso/espresso-minimiser';
import { NetlistBuilder } from '../netlist/build';
import type { FlatNetlist } from '../netlist/ir';
import { applyProposals } from '../rewrite/apply';
import { simulate } from '../verify/switch-sim';
import { RULES } from './index';
import { scan } from './scan';
import { pick, savingsProperty } from './support/rule-test-kit';

const INPUTS = ['A', 'B', 'C'];

/** A gate's inputs: an index into the signals met so far (inputs, then earlier gates), or a rail. */
const inputArb = fc.oneof({ weight: 8, arbitrary: fc.nat(20) }, { weight: 1, arbitrary: fc.constantFrom('VCC', '0') });
const gateArb = fc.array(inputArb, { minLength: 1, maxLength: 2 });
const designArb = fc.record({
  gates: fc.array(gateArb, { minLength: 2, maxLength: 6 }),
  slices: fc.integer({ min: 1, max: 3 }),
});

/**
 * Resistor-transistor NOR gates (one transistor and base resistor per input, a collector
 * resistor), in `slices` copies of one slice reading the shared inputs A, B and C; a gate input may
 * be tied to VCC or ground (constant-input's case), and a gate may repeat another's inputs
 * (merge-duplicate-logic's and shared-control-driver's case).
 */
function build(spec: { gates: (number | string)[][]; slices: number }): FlatNetlist {
  const b = new NetlistBuilder('Wren-8 random slice').rail('VCC', 5).model('QN', 'npn', { IS: 1e-14, BF: 100 });
  for (let s = 0; s < spec.slices; s++) {
    b.within([`X${s}`], () => {
      const signals = INPUTS.map((x) => `/${x}`);
      spec.gates.forEach((inputs, g) => {
        const out = `Y${g}`;
        b.resistor(`RC${g}`, '/VCC', out, 1000);
        inputs.forEach((x, k) => {
          const from = typeof x === 'number' ? signals[x % signals.length] : `/${x}`;
          b.resistor(`RB${g}_${k}`, from, `B${g}_${k}`, 4700);
          b.npn(`Q${g}_${k}`, out, `B${g}_${k}`, '/0', { model: 'QN' });
        });
        signals.push(out);
      });
    });
  }
  return b.build();
}

/** Nets with at least one device terminal. */
function connected(nl: FlatNetlist): Set<string> {
  const ids = new Set<number>();
  for (const d of nl.devices) for (const t of d.terminals) ids.add(t);
  return new Set([...ids].map((id) => nl.nets[id].name));
}

/** Every combination of the inputs the design reads. */
function vectorsOf(nl: FlatNetlist): Record<string, 0 | 1>[] {
  const used = INPUTS.filter((x) => nl.netByName.has(x));
  return Array.from({ length: 1 << used.length }, (_, m) => Object.fromEntries(used.map((x, i) => [x, ((m >> i) & 1) as 0 | 1])));
}

const minimiser = createEspressoMinimiser({ size: 1 });
afterAll(() => minimiser.close());

describe('every proposal the scan proves', () => {
  it.each([
    ['whole', 100_000],
    ['part by part', 1],
  ] as const)('keeps every surviving net on every input combination and saves what it states (proved %s)', async (_how, simulateUpTo) => {
    let proved = 0;
    await fc.assert(
      fc.asyncProperty(designArb, async (spec) => {
        const nl = build(spec);
        const r = await scan(nl, { rules: RULES, minimiser, simulateUpTo });
        expect(r.ruleErrors).toEqual([]);
        const vectors = vectorsOf(nl);
        const before = simulate(nl, { kind: 'vectors', vectors });
        for (const f of r.findings) {
          for (const p of f.proposals) {
            if (p.verification.status !== 'proved') continue;
            proved++;
            const after = applyProposals(nl, [p.proposal]);
            const live = connected(after);
            const names = Object.keys(before.waveforms).filter((n) => live.has(n) && !INPUTS.includes(n));
            // The rewrite keeps every input a remaining part reads; one it no longer reads is not driven.
            const sim = simulate(after, { kind: 'vectors', vectors: vectors.map((v) => Object.fromEntries(Object.entries(v).filter(([x]) => after.netByName.has(x)))) }, { watch: names });
            for (const n of names) {
              before.waveforms[n].forEach((level, step) => {
                // A net the original holds at 0 or 1 must read the same after the rewrite.
                if (level === 0 || level === 1) expect({ proposal: p.proposal.id, net: n, step, level: sim.waveforms[n][step] }).toEqual({ proposal: p.proposal.id, net: n, step, level });
              });
            }
            const { stated, actual } = savingsProperty(nl, p.proposal);
            expect(actual).toEqual(pick(stated));
          }
        }
      }),
      { numRuns: 30, seed: 0x7a11 },
    );
    // The generator must actually produce proved rewrites for the property to say anything.
    expect(proved).toBeGreaterThan(10);
  });
});
