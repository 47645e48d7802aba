// Generates bit-sliced designs of a chosen size (for the benchmark and rule tests), in the shape of
// the demo's Wren-8 register slices: each slice has an enable inverter driven by the shared LOAD
// line, data gating, a clear transistor pulling the slice's pulled-up line low, and an output
// inverter feeding the next slice. Slices are one subcircuit instantiated N times, or written flat.
import { SPICE_TOP } from '../formats/spice/read';
import { GROUND, type Cell, type Design, type Device } from './ir';

export type Family = 'rtl' | 'cmos';

export interface GenerateOptions {
  slices: number;
  family: Family;
  /** Write every slice's devices in the top cell instead of instantiating a slice subcircuit. */
  flat?: boolean;
}

/** Transistors in one slice of each family. */
export const TRANSISTORS_PER_SLICE: Record<Family, number> = { rtl: 5, cmos: 10 };

/** Slices needed for roughly `transistors` transistors. */
export function slicesFor(transistors: number, family: Family): number {
  return Math.max(1, Math.round(transistors / TRANSISTORS_PER_SLICE[family]));
}

type Net = (local: string) => string;

const r = (name: string, a: string, b: string, ohms: number): Device => ({ name, kind: 'resistor', terminals: [a, b], value: ohms, params: {} });
const q = (name: string, c: string, b: string, e: string): Device => ({ name, kind: 'npn', terminals: [c, b, e], model: 'QN', params: {} });
const m = (name: string, kind: 'nmos' | 'pmos', d: string, g: string, s: string, b: string): Device => ({
  name,
  kind,
  terminals: [d, g, s, b],
  model: kind === 'nmos' ? 'NM' : 'PM',
  params: {},
});

/** One slice's devices; `n` maps slice-local net names, `suffix` makes device names unique when flat. */
function sliceDevices(family: Family, n: Net, suffix: string): Device[] {
  const V = 'VCC';
  if (family === 'rtl') {
    return [
      // Enable inverter on the shared LOAD line (one per slice: the repeated control gating).
      r('RBEN' + suffix, n('LOAD'), n('BEN'), 470),
      r('RCEN' + suffix, V, n('ENB'), 640),
      q('QEN' + suffix, n('ENB'), n('BEN'), GROUND),
      // Gated data NOR onto the pulled-up line Q, and the per-slice clear transistor on it.
      r('RBD' + suffix, n('D'), n('BD'), 470),
      r('RBE' + suffix, n('ENB'), n('BE'), 470),
      r('RCQ' + suffix, V, n('Q'), 640),
      q('QD' + suffix, n('Q'), n('BD'), GROUND),
      q('QE' + suffix, n('Q'), n('BE'), GROUND),
      r('RBC' + suffix, n('CLR'), n('BC'), 1000),
      q('QCLR' + suffix, n('Q'), n('BC'), GROUND),
      // Output inverter.
      r('RBO' + suffix, n('Q'), n('BO'), 470),
      r('RCO' + suffix, V, n('OUT'), 640),
      q('QO' + suffix, n('OUT'), n('BO'), GROUND),
    ];
  }
  return [
    // Enable inverter on the shared LOAD line.
    m('MPEN' + suffix, 'pmos', n('ENB'), n('LOAD'), V, V),
    m('MNEN' + suffix, 'nmos', n('ENB'), n('LOAD'), GROUND, GROUND),
    // NAND of data and the slice's enable.
    m('MPA' + suffix, 'pmos', n('X'), n('D'), V, V),
    m('MPB' + suffix, 'pmos', n('X'), n('ENB'), V, V),
    m('MNA' + suffix, 'nmos', n('X'), n('D'), n('S1'), GROUND),
    m('MNB' + suffix, 'nmos', n('S1'), n('ENB'), GROUND, GROUND),
    // Pulled-up line Q driven by X, and the per-slice clear transistor on it.
    r('RQ' + suffix, V, n('Q'), 10_000),
    m('MNQ' + suffix, 'nmos', n('Q'), n('X'), GROUND, GROUND),
    m('MCLR' + suffix, 'nmos', n('Q'), n('CLR'), GROUND, GROUND),
    // Output inverter.
    m('MPO' + suffix, 'pmos', n('OUT'), n('Q'), V, V),
    m('MNO' + suffix, 'nmos', n('OUT'), n('Q'), GROUND, GROUND),
  ];
}

const SLICE_PORTS = ['D', 'OUT', 'LOAD', 'CLR'];

export function generateBitSliced(opts: GenerateOptions): Design {
  const { slices, family } = opts;
  const vcc = family === 'rtl' ? 3.6 : 5;
  const top: Cell = {
    name: SPICE_TOP,
    ports: [],
    devices: [
      { name: 'VCC', kind: 'vsource', terminals: ['VCC', GROUND], value: vcc, params: {} },
      { name: 'VLOAD', kind: 'vsource', terminals: ['LOAD', GROUND], waveform: `PULSE(0 ${vcc} 0 10n 10n 1u 2u)`, params: {} },
      { name: 'VCLR', kind: 'vsource', terminals: ['CLR', GROUND], value: 0, params: {} },
      { name: 'VDIN', kind: 'vsource', terminals: ['DIN', GROUND], value: vcc, params: {} },
    ],
    instances: [],
  };
  const cells: Record<string, Cell> = { [SPICE_TOP]: top };
  // Slice i reads the previous slice's output, so every data net has a driver and a load.
  const dataIn = (i: number) => (i === 0 ? 'DIN' : `OUT${i - 1}`);
  if (opts.flat) {
    for (let i = 0; i < slices; i++) {
      const shared: Record<string, string> = { LOAD: 'LOAD', CLR: 'CLR', D: dataIn(i), OUT: `OUT${i}` };
      const n: Net = (local) => shared[local] ?? `S${i}_${local}`;
      for (const d of sliceDevices(family, n, `_S${i}`)) top.devices.push(d);
    }
  } else {
    cells.SLICE = { name: 'SLICE', ports: SLICE_PORTS, devices: sliceDevices(family, (x) => x, ''), instances: [] };
    for (let i = 0; i < slices; i++) {
      top.instances.push({ name: `X${i}`, cell: 'SLICE', connections: [dataIn(i), `OUT${i}`, 'LOAD', 'CLR'], params: {} });
    }
  }
  top.devices.push({ name: 'RLOUT', kind: 'resistor', terminals: [`OUT${slices - 1}`, GROUND], value: 100_000, params: {} });
  return {
    title: `Wren-8 style ${family.toUpperCase()} register, ${slices} slices${opts.flat ? ' (flat)' : ''}`,
    format: 'spice',
    top: SPICE_TOP,
    cells,
    models: {
      QN: { name: 'QN', type: 'npn', params: { IS: 1e-14, BF: 100 } },
      NM: { name: 'NM', type: 'nmos', params: { LEVEL: 1, VTO: 0.7, KP: 110e-6 } },
      PM: { name: 'PM', type: 'pmos', params: { LEVEL: 1, VTO: -0.7, KP: 50e-6 } },
    },
    globals: ['VCC'],
    params: {},
    extraCards: [{ text: '.op' }],
  };
}
