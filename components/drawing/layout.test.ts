// Proves the layout: a symbol per device kind (IEEE 315 glyphs for transistors and passives,
// IEEE 91 shapes for gates), every part and net placed exactly once, wires that start and end on
// the symbols' pins, and the same drawing for the same graph.
import { describe, expect, it } from 'vitest';
import { NetlistBuilder } from '@/optimizer/netlist/build';
import { designGraph } from '@/optimizer/region/graph';
import { extractRegion } from '@/optimizer/region/region';
import { sliceInverters } from '@/optimizer/rules/test-helpers';
import { emptyEdit } from '@/optimizer/rules/types';
import { layoutRegion } from './layout';
import { geometryOf } from './symbol-geometry';

/** One of every device kind the drawing knows. */
function zoo() {
  const b = new NetlistBuilder('Wren-8 parts drawer');
  b.rail('VCC', 5);
  b.model('QN', 'npn', {});
  b.model('QP', 'pnp', {});
  b.model('MN', 'nmos', {});
  b.model('MP', 'pmos', {});
  b.model('D1N', 'd', {});
  b.npn('Q1', 'C1', 'B1', '0', { model: 'QN' });
  b.pnp('Q2', '0', 'B1', 'VCC', { model: 'QP' });
  b.nmos('M1', 'C1', 'G1', '0', { model: 'MN' });
  b.pmos('M2', 'C1', 'G1', 'VCC', { model: 'MP', bulk: 'VCC' });
  b.resistor('R1', 'VCC', 'C1', 1000);
  b.capacitor('C1', 'C1', '0', 1e-9);
  b.diode('D1', 'B1', 'G1', { model: 'D1N' });
  const ops = ['and', 'or', 'nand', 'nor', 'xor', 'xnor', 'not', 'buf', 'bufif1', 'notif0', 'dff'] as const;
  ops.forEach((op, i) => b.gate(`U${i}`, op, op === 'not' || op === 'buf' ? [`Y${i}`, 'G1'] : [`Y${i}`, 'G1', 'B1']));
  return b.build();
}

describe('symbols', () => {
  it('gives each device kind and gate operation its own glyph', () => {
    const g = designGraph(zoo());
    const glyph = Object.fromEntries(g.parts.map((p) => [p.name, geometryOf(p).glyph]));
    expect(glyph).toMatchObject({ Q1: 'npn', Q2: 'pnp', M1: 'nmos', M2: 'pmos', R1: 'resistor', C1: 'capacitor', D1: 'diode' });
    expect(['U0', 'U1', 'U2', 'U3', 'U4', 'U5', 'U6', 'U7', 'U8', 'U9', 'U10'].map((n) => glyph[n])).toEqual(['and', 'or', 'nand', 'nor', 'xor', 'xnor', 'not', 'buf', 'bufif', 'notif', 'dff']);
  });

  it('has a pin for every terminal of every part', () => {
    for (const p of designGraph(zoo()).parts) {
      const pins = geometryOf(p).pins.map((x) => x.name);
      for (const t of p.terminals) expect(pins, `${p.name}.${t.name}`).toContain(t.name);
    }
  });
});

// The layout engine is compiled Java: on a busy machine a few hundred parts can take seconds of wall time.
describe('layoutRegion', { timeout: 120_000 }, () => {
  it('places every part and net exactly once, inside the drawing', async () => {
    const g = designGraph(zoo());
    const d = await layoutRegion(g);
    expect(d.parts.map((p) => p.part.name)).toEqual(g.parts.map((p) => p.name));
    expect(d.nets.map((n) => n.net.name)).toEqual(g.nets.map((n) => n.name));
    for (const p of d.parts) {
      expect(p.x).toBeGreaterThanOrEqual(0);
      expect(p.x + p.geometry.width).toBeLessThanOrEqual(d.width);
      expect(p.y + p.geometry.height).toBeLessThanOrEqual(d.height);
    }
  });

  it('routes each non-rail net between its pins and draws rails as stubs only', async () => {
    const nl = sliceInverters(3);
    const r = extractRegion(nl, { ...emptyEdit(), removeDevices: ['XS1.Q1'] });
    const d = await layoutRegion(r.before);
    const pinPoints = new Set(d.parts.flatMap((p) => p.geometry.pins.map((pin) => `${p.x + pin.x},${p.y + pin.y}`)));
    for (const n of d.nets) {
      if (n.net.railVolts !== undefined) {
        expect(n.wires).toEqual([]);
        expect(n.stubs.length).toBeGreaterThan(0);
        continue;
      }
      for (const w of n.wires) {
        // ELK's orthogonal router ends each wire on a port; allow sub-unit rounding.
        const near = (p: { x: number; y: number }) => [...pinPoints].some((k) => { const [x, y] = k.split(',').map(Number); return Math.abs(x - p.x) < 1 && Math.abs(y - p.y) < 1; });
        expect(near(w[0]) || near(w[w.length - 1]), n.net.name).toBe(true);
      }
    }
  });

  it('is deterministic', async () => {
    const g = designGraph(sliceInverters(4));
    const a = await layoutRegion(g);
    const b = await layoutRegion(g);
    expect(a).toEqual(b);
  });

  it('lays out a few hundred parts', async () => {
    const g = designGraph(sliceInverters(100));
    const d = await layoutRegion(g);
    expect(d.parts).toHaveLength(300);
    expect(new Set(d.parts.map((p) => `${p.x},${p.y}`)).size).toBe(300);
  });
});
