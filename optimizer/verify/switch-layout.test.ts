// The switch model's layout: nets and edges renumbered so each group is a range, every list kept in
// its order (the simulator's tests check that results, read by net name, are unchanged).
import { describe, expect, it } from 'vitest';
import { generateBitSliced } from '../netlist/generate';
import { flatten } from '../netlist/flatten';
import { arenaBytes, buildSwitchModel, OP_END, OP_NET } from './switch-model';
import { TypedArena } from '../netlist/typed-arena';
import { SwitchSimulator } from './switch-sim';

const design = (family: 'rtl' | 'cmos') => flatten(generateBitSliced({ slices: 6, family }));

describe('switch model layout', () => {
  for (const family of ['rtl', 'cmos'] as const) {
    it(`${family}: each group's nets and edges are consecutive ids, and the renumbering is a permutation`, () => {
      const nl = design(family);
      const m = buildSwitchModel(nl, ['LOAD']);
      const n = nl.nets.length;
      // netPos and netAt are inverse permutations of the netlist's ids
      expect([...m.netAt].sort((a, b) => a - b)).toEqual(Array.from({ length: n }, (_, i) => i));
      for (let i = 0; i < n; i++) expect(m.netAt[m.netPos[i]]).toBe(i);
      expect(m.groupNetOff[m.groupCount]).toBeGreaterThan(0);
      for (let g = 0; g < m.groupCount; g++) {
        for (let p = m.groupNetOff[g]; p < m.groupNetOff[g + 1]; p++) expect(m.groupOf[p]).toBe(g);
        for (let e = m.groupEdgeOff[g]; e < m.groupEdgeOff[g + 1]; e++) {
          // an edge joins nets of its own group or a source (rail or input)
          for (const end of [m.edgeA[e], m.edgeB[e]]) expect([g, -1]).toContain(m.groupOf[end]);
          expect([m.edgeA[e], m.edgeB[e]].some((end) => m.groupOf[end] === g)).toBe(true);
          // the edge's ends are its device's channel terminals, read through the renumbering
          const t = nl.devices[m.edgeDevice[e]].terminals;
          expect([m.netAt[m.edgeA[e]], m.netAt[m.edgeB[e]]]).toEqual(t.length === 2 ? [t[0], t[1]] : [t[0], t[2]]);
          if (m.programAt[e] >= 0) {
            // a base-drive program reads nets by model id; each names a real net
            for (let pc = m.programAt[e]; m.code[pc] !== OP_END; pc += 2) if (m.code[pc] === OP_NET) expect(m.code[pc + 1]).toBeLessThan(n);
          }
        }
      }
      // edges at a group net: exactly the edges with an end there, ascending; sources list none
      for (let p = 0; p < n; p++) {
        const listed = Array.from(m.edgesAt.list.subarray(m.edgesAt.off[p], m.edgesAt.off[p + 1]));
        const expected: number[] = [];
        if (m.groupOf[p] >= 0) {
          for (let e = 0; e < m.edgeCount; e++) {
            if (m.edgeA[e] === p) expected.push(e);
            if (m.edgeB[e] === p) expected.push(e);
          }
        }
        expect(listed).toEqual(expected);
      }
    });
  }

  for (const family of ['rtl', 'cmos'] as const) {
    it(`${family}: the model's tables and the simulator's state fit the buffer sized for them`, () => {
      const nl = design(family);
      const sim = new SwitchSimulator(nl, ['LOAD'], {});
      sim.apply({ LOAD: 1 });
      const arena = sim.model.alloc as TypedArena;
      // one buffer: the estimate is an upper bound for these designs, so the build starts no further one
      expect(arena.buffers).toBe(1);
      expect(arena.used).toBeGreaterThan(0);
      expect(arena.used).toBeLessThanOrEqual(arenaBytes(nl).kept);
    });
  }
});
