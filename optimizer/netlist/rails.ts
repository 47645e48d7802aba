// Which nets are rails: DC voltage sources chained from ground fix a net's voltage. Generic over the
// net key (names inside one cell while reading, numeric ids after flattening). Linear time: one
// breadth-first walk over the sources from ground.
import type { SourceLoc } from './ir';

export interface RailSource<K> {
  name: string;
  plus: K;
  minus: K;
  volts: number;
  loc?: SourceLoc;
}

export interface RailProblem {
  code: string;
  message: string;
  loc?: SourceLoc;
}

export interface RailSolution<K> {
  volts: Map<K, number>;
  /** The source that fixed each rail's voltage (ground has none). */
  sourceOf: Map<K, string>;
  problems: RailProblem[];
}

const TOLERANCE = 1e-9;

/**
 * Solves rail voltages from DC sources. A source whose both ends are one net is shorted; two
 * chains that give a net different voltages are shorted rails. Sources not connected to ground
 * through other sources are not rails (they float with the circuit).
 */
export function solveRails<K>(sources: RailSource<K>[], ground: K, describe: (k: K) => string): RailSolution<K> {
  const volts = new Map<K, number>([[ground, 0]]);
  const sourceOf = new Map<K, string>();
  const problems: RailProblem[] = [];
  const touching = new Map<K, RailSource<K>[]>();
  for (const s of sources) {
    if (s.plus === s.minus) {
      if (Math.abs(s.volts) > TOLERANCE) {
        problems.push({
          code: 'netlist.shorted-source',
          message: `${s.name} is shorted: both ends are on net ${describe(s.plus)}`,
          loc: s.loc,
        });
      }
      continue;
    }
    for (const end of [s.plus, s.minus]) {
      const list = touching.get(end);
      if (list) list.push(s);
      else touching.set(end, [s]);
    }
  }
  const queue: K[] = [ground];
  const reported = new Set<K>();
  const used = new Set<RailSource<K>>();
  for (let qi = 0; qi < queue.length; qi++) {
    const net = queue[qi];
    const v = volts.get(net)!;
    for (const s of touching.get(net) ?? []) {
      if (used.has(s)) continue;
      used.add(s);
      const other = s.plus === net ? s.minus : s.plus;
      const want = s.plus === net ? v - s.volts : v + s.volts;
      const have = volts.get(other);
      if (have === undefined) {
        volts.set(other, want);
        sourceOf.set(other, s.name);
        queue.push(other);
      } else if (Math.abs(have - want) > TOLERANCE && !reported.has(other)) {
        reported.add(other);
        const first = other === ground ? 'ground' : `${fmtVolts(have)} by ${sourceOf.get(other) ?? 'ground'}`;
        problems.push({
          code: 'netlist.shorted-rails',
          message:
            other === ground
              ? `rail source ${s.name} shorts ${fmtVolts(want)} to ground (net ${describe(other)})`
              : `shorted rails: net ${describe(other)} is held at ${first} and at ${fmtVolts(want)} by ${s.name}`,
          loc: s.loc,
        });
      }
    }
  }
  return { volts, sourceOf, problems };
}

function fmtVolts(v: number): string {
  return `${Number(v.toPrecision(6))} V`;
}
