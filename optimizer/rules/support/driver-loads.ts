// What a driven net carries, by the kind of load: RTL bases through resistors (with each load's
// collector pull-up), DTL input diodes (with the diode node's pull-up the driver must sink), and
// direct loads (bases on the net, MOS gates, gate-level inputs) — for shared-driver margin checks.
import { resistorPullUps } from '../../extract/bipolar';
import { eachTerminal, makeContext, otherEnd, type ExtractContext } from '../../extract/context';
import type { LogicView } from '../../extract/types';
import type { FlatNetlist } from '../../netlist/ir';

export interface ResistorLoad {
  /** Base resistor (device index) and its ohms. */
  resistor: number;
  ohms: number;
  /** The load transistor and its collector pull-up ohms, when it has one. */
  transistor: number;
  collectorPullUp?: number;
}

export interface DiodeLoad {
  diode: number;
  /** Pull-up of the diode node: the current the driver sinks while low. */
  pullUpOhms: number;
}

export interface DriverLoads {
  resistorBases: ResistorLoad[];
  diodeInputs: DiodeLoad[];
  /** Bases on the net itself, MOS gates, gate-level inputs. */
  direct: number;
  total: number;
}

/** One terminal index per netlist, reused by every query of a rule run. */
export class DriverLoadIndex {
  readonly cx: ExtractContext;
  constructor(
    readonly nl: Readonly<FlatNetlist>,
    readonly view: Readonly<LogicView>,
  ) {
    this.cx = makeContext(nl as FlatNetlist);
  }

  private baseTransistor(net: number): number {
    let found = -1;
    eachTerminal(this.cx, net, (d, t) => {
      const k = this.nl.devices[d].kind;
      if ((k === 'npn' || k === 'pnp') && t === 1 && found < 0) found = d;
    });
    return found;
  }

  private collectorPullUp(transistor: number): number | undefined {
    const col = this.nl.devices[transistor].terminals[0];
    const idx = this.view.nodeByNet.get(col);
    const node = idx === undefined ? undefined : this.view.nodes[idx];
    return node?.pullUp?.ohms ?? resistorPullUps(this.cx, col)[0]?.ohms;
  }

  loadsOf(net: number): DriverLoads {
    const out: DriverLoads = { resistorBases: [], diodeInputs: [], direct: 0, total: 0 };
    eachTerminal(this.cx, net, (d, t) => {
      const dev = this.nl.devices[d];
      if (dev.kind === 'resistor') {
        const far = otherEnd(this.cx, d, t);
        if (far === net) return;
        const q = this.baseTransistor(far);
        if (q >= 0 && dev.value !== undefined) {
          const pull = this.collectorPullUp(q);
          out.resistorBases.push({ resistor: d, ohms: dev.value, transistor: q, ...(pull !== undefined ? { collectorPullUp: pull } : {}) });
        }
      } else if (dev.kind === 'diode' && t === 1) {
        const pulls = resistorPullUps(this.cx, dev.terminals[0]);
        if (pulls.length && pulls[0].ohms !== undefined) out.diodeInputs.push({ diode: d, pullUpOhms: pulls[0].ohms });
      } else if ((dev.kind === 'npn' || dev.kind === 'pnp' || dev.kind === 'nmos' || dev.kind === 'pmos') && t === 1) out.direct++;
      else if (dev.kind === 'gate' && t >= 1 && dev.op !== 'pullup' && dev.op !== 'pulldown') out.direct++;
    });
    out.total = out.resistorBases.length + out.diodeInputs.length + out.direct;
    return out;
  }
}

export function mergeDriverLoads(list: DriverLoads[]): DriverLoads {
  const out: DriverLoads = { resistorBases: [], diodeInputs: [], direct: 0, total: 0 };
  for (const l of list) {
    out.resistorBases.push(...l.resistorBases);
    out.diodeInputs.push(...l.diodeInputs);
    out.direct += l.direct;
    out.total += l.total;
  }
  return out;
}

/** The equal base resistor that loads a line like these do together: N / Σ 1/R_B,i. */
export function equivalentBaseResistor(loads: ResistorLoad[]): number {
  return loads.length / loads.reduce((s, l) => s + 1 / l.ohms, 0);
}
