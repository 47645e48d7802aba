// Margin checks of one driver made to carry the loads of several: fan-out; for a pulled-up
// bipolar output, the loaded high level and load base current of resistor-fed bases, and the sink
// current and forced β its own transistor needs for diode inputs it must pull low.
import type { LogicNode } from '../../extract/types';
import type { MapFamily } from '../../logic/family-parts';
import { forcedBeta, loadBaseCurrent, loadedHighLevel, sinkCurrent } from '../../margins/bipolar';
import type { MarginResult } from '../../margins/corners';
import { betaMinOf, type MarginSettings } from '../../margins/defaults';
import { fanOut } from '../../margins/line';
import type { FlatNetlist } from '../../netlist/ir';
import { equivalentBaseResistor, type DriverLoads } from './driver-loads';

/** β_min of a transistor from its model (BF derated) or the family default. */
export function betaMinOfDevice(nl: FlatNetlist, device: number, s: MarginSettings): number {
  const m = nl.devices[device].model;
  return betaMinOf(m ? nl.models[m.toLowerCase()] : undefined, s).beta;
}

/**
 * Base resistor and drive level of a bipolar driver's (first) switch: a resistor from a control
 * net driven to the supply, or a DTL diode node pull-up less its level-shift drops.
 */
export function baseDriveOf(nl: FlatNetlist, node: LogicNode, s: MarginSettings): { ohms: number; volts: number; transistor: number } | undefined {
  const b = node.groups[0]?.bases[0];
  const vcc = node.pullUp?.railVolts;
  if (!b || vcc === undefined) return undefined;
  if (b.kind === 'diode-and' && b.diodePullUp?.ohms !== undefined) {
    return { ohms: b.diodePullUp.ohms, volts: vcc - b.levelShiftDiodes.length * s.vDiode, transistor: b.transistor };
  }
  const r = b.baseResistors.map((x) => x.ohms).filter((x): x is number => x !== undefined);
  if (r.length === 0) return undefined;
  return { ohms: Math.max(...r), volts: vcc, transistor: b.transistor };
}

export function sharedDriverMargins(nl: FlatNetlist, driver: LogicNode, loads: DriverLoads, s: MarginSettings): MarginResult[] {
  const family: MapFamily = driver.family;
  const out: MarginResult[] = [fanOut({ loads: loads.total, family }, s)];
  const rc = driver.pullUp?.kind === 'resistor' ? driver.pullUp.ohms : undefined;
  const vcc = driver.pullUp?.railVolts;
  if (rc === undefined || vcc === undefined) return out;
  if (loads.resistorBases.length) {
    const rb = equivalentBaseResistor(loads.resistorBases);
    out.push(loadedHighLevel({ vcc, rc, rb, loads: loads.resistorBases.length, receiver: 'rtl' }, s));
    const pulled = loads.resistorBases.filter((l) => l.collectorPullUp !== undefined);
    if (pulled.length) {
      const loadPullUp = Math.min(...pulled.map((l) => l.collectorPullUp!));
      const betaMin = Math.min(...pulled.map((l) => betaMinOfDevice(nl, l.transistor, s)));
      out.push(loadBaseCurrent({ vcc, rc, rb, loads: loads.resistorBases.length, loadPullUp, betaMin }, s));
    }
  }
  if (loads.diodeInputs.length) {
    const pullUps = [rc, ...loads.diodeInputs.map((d) => d.pullUpOhms)];
    out.push(sinkCurrent({ vcc, pullUps }, s));
    const drive = baseDriveOf(nl, driver, s);
    if (drive) {
      out.push(forcedBeta({ vcc, pullUps, baseResistor: drive.ohms, driveVolts: drive.volts, betaMin: betaMinOfDevice(nl, drive.transistor, s) }, s));
    }
  }
  return out;
}
