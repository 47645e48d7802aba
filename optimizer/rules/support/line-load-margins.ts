// Electrical checks of a line that takes on more loads (a merged driver, a bypassed inverter pair):
// fan-out for the family, and for a resistor-pulled RTL line driving bases through resistors the
// loaded high level and each load's base current (optimizer/margins formulas, worst corners).
import type { LogicNode } from '../../extract/types';
import type { MapFamily } from '../../logic/family-parts';
import { loadBaseCurrent, loadedHighLevel } from '../../margins/bipolar';
import type { MarginResult } from '../../margins/corners';
import { fanOut } from '../../margins/line';
import { betaMinOf, type MarginSettings } from '../../margins/defaults';
import type { NetIndex } from './net-index';

/** One load on a line: a base resistor (RTL) with what that base must saturate, or a plain input. */
export interface LineLoad {
  device: number;
  rb?: number;
  /** Smallest collector pull-up the loaded transistor must saturate, ohms. */
  loadPullUp?: number;
  betaMin?: number;
}

/** Loads of a net as fan-out counts them (one per reading node), with base-resistor detail. */
export function lineLoads(idx: NetIndex, net: number, s: MarginSettings, except: Set<number> = new Set()): LineLoad[] {
  const out: LineLoad[] = [];
  const seenOwner = new Set<number>();
  for (const l of idx.loads(net)) {
    if (except.has(l.device)) continue;
    const dev = idx.nl.devices[l.device];
    if (l.owner >= 0) {
      const node = idx.view.nodes[l.owner];
      const base = dev.kind === 'resistor' ? node.groups.flatMap((g) => g.bases).find((b) => b.baseResistors.some((r) => r.device === l.device)) : undefined;
      if (base) {
        const q = idx.nl.devices[base.transistor];
        out.push({
          device: l.device,
          rb: dev.value,
          loadPullUp: node.pullUps.filter((u) => u.ohms).reduce<number | undefined>((m, u) => (m === undefined ? u.ohms : Math.min(m, u.ohms!)), undefined),
          betaMin: betaMinOf(q.model ? idx.nl.models[q.model.toLowerCase()] : undefined, s).beta,
        });
        continue;
      }
      if (seenOwner.has(l.owner)) continue;
      seenOwner.add(l.owner);
    }
    out.push({ device: l.device });
  }
  return out;
}

/** Fan-out, and loaded high level / load base current where the line is an RTL resistor pull-up. */
export function lineMargins(driver: LogicNode | undefined, loads: LineLoad[], family: MapFamily, s: MarginSettings): MarginResult[] {
  const out: MarginResult[] = [fanOut({ loads: loads.length, family }, s)];
  if (!driver) {
    out[0] = { ...out[0], note: `${out[0].note}; the line is driven from outside this design — check its driver's data sheet` };
    return out;
  }
  const rc = driver.pullUp?.kind === 'resistor' ? driver.pullUp.ohms : undefined;
  const bases = loads.filter((l) => l.rb !== undefined);
  if (rc === undefined || bases.length === 0 || bases.length !== loads.length) return out;
  const vcc = driver.pullUp!.railVolts;
  const rb = Math.min(...bases.map((l) => l.rb!));
  out.push(loadedHighLevel({ vcc, rc, rb, loads: bases.length, receiver: family === 'dtl' ? 'dtl' : 'rtl' }, s));
  const withLoad = bases.filter((l) => l.loadPullUp !== undefined);
  if (withLoad.length) {
    out.push(
      loadBaseCurrent(
        {
          vcc,
          rc,
          rb,
          loads: bases.length,
          loadPullUp: Math.min(...withLoad.map((l) => l.loadPullUp!)),
          betaMin: Math.min(...withLoad.map((l) => l.betaMin ?? s.defaultBetaMin)),
        },
        s,
      ),
    );
  }
  return out;
}

export const failing = (ms: MarginResult[]): boolean => ms.some((m) => m.status === 'fail');
