// Proves a proposal's region holds exactly the changed nets' fan-in, the edit's devices and the
// rails, and that proofs on the region agree with proofs on the whole design.
import { describe, expect, it } from 'vitest';
import { extractLogic } from '../extract';
import { NetlistBuilder } from '../netlist/build';
import { regionOf } from './region';
import { verifyProposal } from './scan';
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
