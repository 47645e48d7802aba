// devicesOnTouchedNodes: the internal nodes an edit joins, leaves or lands on give up their
// devices; driven nets, inputs and rails do not.
import { describe, expect, it } from 'vitest';
import { extractLogic } from '../extract';
import { NetlistBuilder } from '../netlist/build';
import type { FlatNetlist } from '../netlist/ir';
import { devicesOnTouchedNodes } from './touched-nodes';
import { emptyEdit } from './types';

/** Two RTL stacks: VCC ─RC─ XOk.Y ─ QD(Dk) ─ XOk.N ─ QE(EN) ─ 0. */
function stacks(): FlatNetlist {
  const b = new NetlistBuilder('Wren-8 bus output stacks');
  b.rail('VCC', 5);
  b.model('QN', 'npn', { IS: 1e-14, BF: 100 });
  for (let k = 0; k < 2; k++) {
    b.within([`XO${k}`], () => {
      b.resistor('RC', 'VCC', 'Y', 1000);
      b.resistor('RD', `/D${k}`, 'BD', 4700);
      b.npn('QD', 'Y', 'BD', 'N');
      b.resistor('RE', '/EN', 'BE', 2200);
      b.npn('QE', 'N', 'BE', '0');
    });
  }
  return b.build();
}

const names = (nl: FlatNetlist, ids: number[]) => ids.map((i) => nl.devices[i].name).sort();

describe('devicesOnTouchedNodes', () => {
  it('a merge gives up the devices on both internal nodes, the kept one included', () => {
    const nl = stacks();
    const edit = emptyEdit();
    edit.mergeNets.push({ keep: 'XO0.N', remove: 'XO1.N' });
    expect(names(nl, devicesOnTouchedNodes(nl, extractLogic(nl), edit))).toEqual(['XO0.QD', 'XO0.QE', 'XO1.QD', 'XO1.QE']);
  });

  it('a removed base resistor gives up its base node, not the enable input it reads', () => {
    const nl = stacks();
    const edit = emptyEdit();
    edit.removeDevices.push('XO1.RE');
    // EN is an input read by both stacks: their functions still name it, so they stay out
    expect(names(nl, devicesOnTouchedNodes(nl, extractLogic(nl), edit))).toEqual(['XO1.QE', 'XO1.RE']);
  });

  it('a part landing on a driven output leaves that output to be compared by name', () => {
    const nl = stacks();
    const edit = emptyEdit();
    edit.addDevices.push({ name: 'QX', kind: 'npn', terminals: ['XO0.Y', 'BX', '0'] });
    expect(devicesOnTouchedNodes(nl, extractLogic(nl), edit)).toEqual([]);
    edit.addDevices[0].terminals = ['XO0.N', 'BX', '0'];
    expect(names(nl, devicesOnTouchedNodes(nl, extractLogic(nl), edit))).toEqual(['XO0.QD', 'XO0.QE']);
  });
});
