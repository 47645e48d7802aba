// Proves a proposal's region holds exactly the changed nets' fan-in, the edit's devices and the
// rails, and that proofs on the region agree with proofs on the whole design.
import { describe, expect, it } from 'vitest';
import { extractLogic } from '../extract';
import { exprToString } from '../logic/expr';
import { NetlistBuilder } from '../netlist/build';
import { regionOf } from './region';
import { scan, verifyProposal } from './scan';
import { deckNetlist } from './support/rule-test-kit';
import { sliceInverters } from './test-helpers';
import { emptyEdit, type Proposal } from './types';

describe('regionOf', () => {
  it('cuts one slice out of ten', () => {
    const nl = sliceInverters(10);
    const view = extractLogic(nl);
    const edit = { ...emptyEdit(), reconnect: [{ device: 'XS3.RB', terminal: 0, net: 'CLR' }] };
    const r = regionOf(nl, view, ['XS3.LDN'], edit);
    expect(r.devices.map((d) => d.name).sort()).toEqual(['VVCC', 'XS3.Q1', 'XS3.RB', 'XS3.RC']);
    expect(r.nets[r.devices.find((d) => d.name === 'XS3.Q1')!.terminals[0]].name).toBe('XS3.LDN');
    expect(r.netByName.has('XS4.LDN')).toBe(false);
  });

  it('gives the same verdicts as the whole design', () => {
    const nl = sliceInverters(6);
    const view = extractLogic(nl);
    const good: Proposal = { id: 'g', title: 'g', assumptions: [], margins: [], edit: { ...emptyEdit(), removeDevices: ['XS2.Q1', 'XS2.RC', 'XS2.RB'], mergeNets: [{ keep: 'XS1.LDN', remove: 'XS2.LDN' }] } };
    const bad: Proposal = { id: 'b', title: 'b', assumptions: [], margins: [], edit: { ...emptyEdit(), reconnect: [{ device: 'XS2.RB', terminal: 0, net: 'CLR' }] } };
    expect(verifyProposal({ nl, view }, good, []).status).toBe('proved');
    const refuted = verifyProposal({ nl, view }, bad, []);
    expect(refuted.status).toBe('refuted');
    expect(refuted.counterexample!.LOAD).not.toBe(refuted.counterexample!.CLR);
  });

  it('keeps the driver of a net a rail-tied input folded out of the function', () => {
    // Q = NOR(D, EN) with D tied to VCC is constant 0: its function reads no net, but QE's base
    // resistor still reads EN, and EN left undriven would float in the region's simulation.
    //   LD ─RB─┤QN├─ EN ─RE─┤QE├─┐
    //                     VCC─RD─┤QD├─┴─ Q (RC to VCC)
    const b = new NetlistBuilder('Wren-8 tied data bit');
    b.rail('VCC', 5);
    b.model('QN', 'npn', { IS: 1e-14, BF: 100 });
    b.resistor('RB', 'LD', 'B', 4700);
    b.npn('QN', 'EN', 'B', '0', { model: 'QN' });
    b.resistor('RCN', 'VCC', 'EN', 1000);
    b.resistor('RE', 'EN', 'BE', 4700);
    b.npn('QE', 'Q', 'BE', '0', { model: 'QN' });
    b.resistor('RD', 'VCC', 'BD', 4700);
    b.npn('QD', 'Q', 'BD', '0', { model: 'QN' });
    b.resistor('RC', 'VCC', 'Q', 1000);
    const nl = b.build();
    const view = extractLogic(nl);
    expect(view.nodes[view.nodeByNet.get(nl.netByName.get('Q')!)!].inputs).toEqual([]);
    const r = regionOf(nl, view, ['Q'], { ...emptyEdit(), removeDevices: ['QD', 'RD'] });
    expect(r.devices.map((d) => d.name)).toEqual(expect.arrayContaining(['QN', 'RB', 'RCN', 'QE', 'RE']));
  });
});

/**
 * n Wren-8 DTL bus bits, each with the bus-driver demo's own enable inverter (EN = NOT OEN: a
 * diode input and two level-shift diodes into QI's base) feeding an enable stack whose base is
 * coupled from EN as given. Device and net numbers shift with n, so a reading of a base that
 * depended on them would change with the width.
 */
function busBits(n: number, enableBase: string): string {
  const bits = Array.from({ length: n }, (_, k) => `XO${k} D${k} OEN BUS${k} BUSBIT\nRL${k} VCC BUS${k} 2k`).join('\n');
  return `Wren-8 DTL bus bits with their own enable inverters
.global VCC
VCC VCC 0 DC 5
.subckt BUSBIT D OEN Y
RPI VCC PI 4.7k
DI PI OEN DX
DI1 PI MI DX
DI2 MI BI DX
RBI BI 0 5k
RCI VCC EN 2k
QI EN BI 0 QN
RD D BD 4.7k
QD Y BD N QN
${enableBase}
RB BE 0 5k
QE N BE 0 QN
.ends BUSBIT
${bits}
.model QN NPN (IS=1e-14 BF=50)
.model DX D (IS=1e-14)
.end
`;
}

describe('regionOf on DTL bus bits', () => {
  it.each([
    ['a resistor and a diode', 'RE EN X 2.2k\nDB X BE DX'],
    ['a diode gate', 'RP VCC P 2k\nDE P EN DX\nDL1 P M DX\nDL2 M BE DX'],
    // EN has its own pull-up (QI's collector resistor): a signal, not a diode gate's node
    ['a level-shift diode straight from the inverter output', 'DB EN BE DX'],
  ])('enable base through %s: the region reads every compared net as the whole design does, and each proposal is proved at 3, 4, 5 and 12 bits', async (_l, base) => {
    for (const n of [3, 4, 5, 12]) {
      const nl = deckNetlist(busBits(n, base));
      const view = extractLogic(nl);
      const whole = new Map(view.nodes.map((x) => [x.name, exprToString(x.fn)]));
      for (let k = 0; k < n; k++) {
        expect([n, whole.get(`XO${k}.EN`)]).toEqual([n, '!OEN']);
        expect([n, whole.get(`BUS${k}`)]).toEqual([n, `!(D${k} & XO${k}.EN)`]);
      }
      expect(view.inputs).toEqual(['OEN', ...Array.from({ length: n }, (_, k) => `D${k}`)].sort());
      const r = await scan(nl, { view });
      const proposals = r.findings.flatMap((f) => f.proposals.map((q) => ({ rule: f.finding.ruleId, q })));
      expect(proposals.map((x) => x.rule).sort()).toEqual(['merge-duplicate-logic', 'shared-control-driver']);
      for (const { rule, q } of proposals) {
        expect([n, rule, q.verification.status]).toEqual([n, rule, 'proved']);
        const region = regionOf(nl, view, q.verification.compared, q.proposal.edit);
        expect(region.devices.length).toBeLessThan(nl.devices.length);
        const cut = new Map(extractLogic(region).nodes.map((x) => [x.name, exprToString(x.fn)]));
        for (const name of q.verification.compared) expect([n, name, cut.get(name)]).toEqual([n, name, whole.get(name)]);
      }
    }
  });
});
