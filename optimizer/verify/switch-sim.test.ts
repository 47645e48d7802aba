// Switch-level simulation (Bryant 1984): logic of RTL, DTL and CMOS gates, strengths, contention
// → X with the drivers named, floating → Z with the charge kept and its readers reported, latches
// holding state, oscillation bounded and reported, gate-level designs and clocked stimulus.
import { describe, expect, it } from 'vitest';
import { netlist } from '../netlist/build';
import { simulate } from './switch-sim';

const rtlInverter = (b: ReturnType<typeof netlist>, a: string, y: string) =>
  b.resistor(`RB_${y}`, a, `B_${y}`, 10e3).npn(`Q_${y}`, y, `B_${y}`, '0').resistor(`RC_${y}`, 'VCC', y, 1e3);
const cmosInverter = (b: ReturnType<typeof netlist>, a: string, y: string, tag = y) =>
  b.pmos(`P_${tag}`, y, a, 'VDD', { bulk: 'VDD' }).nmos(`N_${tag}`, y, a, '0');

describe('switch-level simulation', () => {
  it('RTL inverter chain follows its input', () => {
    const b = netlist().rail('VCC', 5);
    rtlInverter(b, 'A', 'Y1');
    rtlInverter(b, 'Y1', 'Y2');
    const r = simulate(b.build(), { kind: 'vectors', vectors: [{ A: 0 }, { A: 1 }, { A: 0 }] });
    expect(r.waveforms.Y1).toEqual([1, 0, 1]);
    expect(r.waveforms.Y2).toEqual([0, 1, 0]);
    expect(r.contention).toEqual([]);
  });

  it('DTL NAND and CMOS NAND on every input combination', () => {
    const b = netlist().rail('VCC', 5).rail('VDD', 5);
    b.resistor('RP', 'VCC', 'P', 2e3).diode('DA', 'P', 'A').diode('DB', 'P', 'B').diode('DS1', 'P', 'X').diode('DS2', 'X', 'BASE');
    b.resistor('RB', 'BASE', '0', 5e3).npn('Q1', 'Y', 'BASE', '0').resistor('RC', 'VCC', 'Y', 2e3);
    b.pmos('P1', 'Z', 'A', 'VDD', { bulk: 'VDD' }).pmos('P2', 'Z', 'B', 'VDD', { bulk: 'VDD' });
    b.nmos('N1', 'Z', 'A', 'm').nmos('N2', 'm', 'B', '0');
    const vectors = [0, 1, 2, 3].map((i) => ({ A: (i >> 1) as 0 | 1, B: (i & 1) as 0 | 1 }));
    const r = simulate(b.build(), { kind: 'vectors', vectors });
    expect(r.waveforms.Y).toEqual([1, 1, 1, 0]);
    expect(r.waveforms.Z).toEqual([1, 1, 1, 0]);
  });

  it('a rail-strength pull-down beats a resistor pull-up without contention', () => {
    const b = netlist().rail('VCC', 5);
    rtlInverter(b, 'A', 'Y');
    b.within(['XO'], () => b.resistor('RB', '/CLR', 'BQ', 10e3).npn('Q1', '/Y', 'BQ', '0'));
    const r = simulate(b.build(), { kind: 'vectors', vectors: [{ A: 0, CLR: 0 }, { A: 0, CLR: 1 }] });
    expect(r.waveforms.Y).toEqual([1, 0]);
    expect(r.contention).toEqual([]);
  });

  it('a pulled-up output with a load resistor to ground reads high (bleed is weaker than a pull-up)', () => {
    const b = netlist().rail('VCC', 5);
    rtlInverter(b, 'A', 'Y');
    b.resistor('RLOAD', 'Y', '0', 10e3);
    const r = simulate(b.build(), { kind: 'vectors', vectors: [{ A: 0 }, { A: 1 }] });
    expect(r.waveforms.Y).toEqual([1, 0]);
    expect(r.contention).toEqual([]);
  });

  it('two driven outputs fighting give X and name both drivers', () => {
    const b = netlist().rail('VDD', 5);
    cmosInverter(b, 'A', 'BUS', 'U1');
    cmosInverter(b, 'B', 'BUS', 'U2');
    const r = simulate(b.build(), { kind: 'vectors', vectors: [{ A: 0, B: 0 }, { A: 0, B: 1 }] });
    expect(r.waveforms.BUS).toEqual([1, 'X']);
    expect(r.contention).toHaveLength(1);
    expect(r.contention[0]).toMatchObject({ net: 'BUS', step: 1 });
    expect([...r.contention[0].drivers].sort()).toEqual(['N_U2', 'P_U1']);
  });

  it('a disabled tri-state output floats (Z), keeps its charge, shares it, and its reader is reported', () => {
    const b = netlist().rail('VDD', 5);
    b.pmos('P1', 'm1', 'ENB', 'VDD', { bulk: 'VDD' }).pmos('P2', 'Y', 'A', 'm1', { bulk: 'VDD' });
    b.nmos('N2', 'Y', 'A', 'm2').nmos('N1', 'm2', 'EN', '0');
    cmosInverter(b, 'Y', 'YB');
    const r = simulate(b.build(), {
      kind: 'vectors',
      vectors: [
        { EN: 1, ENB: 0, A: 0 },
        { EN: 0, ENB: 1, A: 0 },
        { EN: 0, ENB: 1, A: 1 },
      ],
    });
    expect(r.waveforms.Y).toEqual([1, 'Z', 'Z']);
    // the stored 1 still drives the reader while Y floats (step 1); at step 2 A turns the lower
    // NMOS on and Y shares its charge with the stack node, which stored 0: unknown (Bryant 1984)
    expect(r.waveforms.YB).toEqual([0, 0, 'X']);
    expect(r.floatingReads.map((f) => [f.net, f.step])).toEqual([
      ['Y', 1],
      ['Y', 2],
    ]);
    expect(r.floatingReads[0].readers.sort()).toEqual(['N_YB', 'P_YB']);
  });

  it('an RTL SR latch from cross-coupled NORs sets, holds and resets', () => {
    const b = netlist().rail('VCC', 5);
    const nor = (out: string, a: string, c: string) =>
      b
        .resistor(`RC_${out}`, 'VCC', out, 1e3)
        .resistor(`R1_${out}`, a, `B1_${out}`, 4.7e3)
        .resistor(`R2_${out}`, c, `B2_${out}`, 4.7e3)
        .npn(`Q1_${out}`, out, `B1_${out}`, '0')
        .npn(`Q2_${out}`, out, `B2_${out}`, '0');
    nor('Q', 'R', 'QB');
    nor('QB', 'S', 'Q');
    const r = simulate(b.build(), {
      kind: 'vectors',
      vectors: [
        { S: 1, R: 0 },
        { S: 0, R: 0 },
        { S: 0, R: 1 },
        { S: 0, R: 0 },
      ],
    });
    expect(r.waveforms.Q).toEqual([1, 1, 0, 0]);
    expect(r.waveforms.QB).toEqual([0, 0, 1, 1]);
    expect(r.oscillations).toEqual([]);
  });

  it('a ring oscillator is stopped at the bound, set to X and reported', () => {
    const b = netlist().rail('VDD', 5);
    // N1 = NAND(EN, N3), N2 = !N1, N3 = !N2: odd inversion around the ring while EN = 1
    b.pmos('PA', 'N1', 'EN', 'VDD', { bulk: 'VDD' }).pmos('PB', 'N1', 'N3', 'VDD', { bulk: 'VDD' });
    b.nmos('NA', 'N1', 'EN', 'm').nmos('NB', 'm', 'N3', '0');
    cmosInverter(b, 'N1', 'N2');
    cmosInverter(b, 'N2', 'N3');
    const r = simulate(b.build(), { kind: 'vectors', vectors: [{ EN: 0 }, { EN: 1 }] }, { maxEvaluationsPerGroup: 20 });
    expect(r.waveforms.N1[0]).toBe(1);
    expect(r.oscillations.length).toBeGreaterThan(0);
    expect(r.oscillations[0].step).toBe(1);
    expect(r.waveforms.N1[1]).toBe('X');
  });

  it('gate-level designs: a clocked D flip-flop samples on the rising edge; bufif1 buses resolve', () => {
    const nl = netlist()
      .gate('F1', 'dff', ['Q', 'D', 'CLK'])
      .gate('T1', 'bufif1', ['BUS', 'Q', 'E1'])
      .gate('T2', 'bufif1', ['BUS', 'D', 'E2'])
      .build();
    const r = simulate(nl, {
      kind: 'clocked',
      clock: 'CLK',
      vectors: [
        { D: 1, E1: 1, E2: 0 },
        { D: 0, E1: 1, E2: 0 },
        { D: 0, E1: 0, E2: 0 },
        { D: 1, E1: 1, E2: 1 },
      ],
    });
    expect(r.waveforms.Q).toEqual(['X', 1, 1, 0, 0, 0, 0, 1]);
    expect(r.waveforms.BUS.slice(0, 6)).toEqual(['X', 1, 1, 0, 'Z', 'Z']);
    expect(r.waveforms.BUS[6]).toBe('X');
    expect(r.contention.some((c) => c.net === 'BUS' && c.step === 6)).toBe(true);
  });

  it('a long transmission line between two drivers: all of it follows agreeing drivers and goes X when they fight', () => {
    // one switch group of 60 nets: per-evaluation scratch is sized by the widest group
    const b = netlist().rail('VDD', 5);
    cmosInverter(b, 'A', 'L0', 'A');
    cmosInverter(b, 'B', 'L59', 'B');
    for (let i = 0; i < 59; i++) b.nmos(`T${i}`, `L${i}`, 'VDD', `L${i + 1}`).pmos(`U${i}`, `L${i}`, '0', `L${i + 1}`, { bulk: 'VDD' });
    const r = simulate(b.build(), { kind: 'vectors', vectors: [{ A: 0, B: 0 }, { A: 0, B: 1 }, { A: 1, B: 1 }] });
    for (let i = 0; i < 60; i++) expect(r.waveforms[`L${i}`]).toEqual([1, 'X', 0]);
    expect(r.contention.map((c) => c.step)).toContain(1);
  });

  it('refuses a stimulus that names a net the design lacks', () => {
    const nl = netlist().gate('G', 'not', ['Y', 'A']).build();
    expect(() => simulate(nl, { kind: 'vectors', vectors: [{ NOPE: 1 }] })).toThrow(/"NOPE"/);
  });
});
