// Switch-level simulation after Bryant, "A switch-level model and simulator for MOS digital
// systems", IEEE Trans. Computers C-33(2), 1984: values 0/1/X/Z, strengths rail > driven
// transistor > pull-up resistor > stored charge, contention → X, floating → Z with the charge kept.
// Event-driven: a group is re-evaluated only when a net it reads changes; each step iterates to a
// fixed point with a bound, and a group that keeps changing is set to X and reported.
import { InputError } from '../errors';
import type { FlatNetlist } from '../netlist/ir';
import type { Expr } from '../logic/expr';
import { gateFunction } from '../extract/gates';
import { buildSwitchModel, CHARGE, DRIVEN, WEAK, type SwitchModel } from './switch-model';

export type Level = 0 | 1 | 'X' | 'Z';
type Mask = number; // bit 0: can be 0, bit 1: can be 1 (3 = X, 0 = nothing)

export type Stimulus =
  | { kind: 'vectors'; vectors: Record<string, 0 | 1 | 'X'>[] }
  /** Each vector is applied with the clock low, then the clock goes high: two steps per vector. */
  | { kind: 'clocked'; clock: string; vectors: Record<string, 0 | 1 | 'X'>[] };

export interface SimOptions {
  /** Nets to record (default: every net, up to 5000; beyond that the stimulus inputs only). */
  watch?: string[];
  /** Evaluations of one group within one step before it is declared oscillating. */
  maxEvaluationsPerGroup?: number;
}

export interface SimResult {
  steps: number;
  waveforms: Record<string, Level[]>;
  contention: { net: string; step: number; drivers: string[] }[];
  floatingReads: { net: string; step: number; readers: string[] }[];
  oscillations: { step: number; nets: string[] }[];
}

const LEVELS: Level[] = ['Z', 0, 1, 'X'];
const maskOf = (v: 0 | 1 | 'X'): Mask => (v === 0 ? 1 : v === 1 ? 2 : 3);

export function expandStimulus(st: Stimulus): Record<string, 0 | 1 | 'X'>[] {
  if (st.kind === 'vectors') return st.vectors;
  return st.vectors.flatMap((v) => [
    { ...v, [st.clock]: 0 as const },
    { ...v, [st.clock]: 1 as const },
  ]);
}

export class SwitchSimulator {
  readonly model: SwitchModel;
  /** Final strength and value mask per net after the last evaluation. */
  private readonly level: Uint8Array;
  private readonly mask: Uint8Array;
  private readonly charge: Uint8Array;
  private readonly gateOut: Uint8Array; // per device: injected mask (0 = Z)
  private step = -1;
  readonly result: SimResult = { steps: 0, waveforms: {}, contention: [], floatingReads: [], oscillations: [] };
  private readonly maxEval: number;
  private readonly pendingFloating = new Map<number, string[]>();
  private readonly pendingContention = new Map<number, string[]>();

  constructor(nl: FlatNetlist, inputs: string[], options: SimOptions = {}) {
    this.model = buildSwitchModel(nl, inputs);
    const n = nl.nets.length;
    this.level = new Uint8Array(n);
    this.mask = new Uint8Array(n).fill(3);
    this.charge = new Uint8Array(n).fill(3);
    this.gateOut = new Uint8Array(nl.devices.length);
    for (const [net, v] of this.model.railValue) {
      this.level[net] = 4;
      this.mask[net] = v ? 2 : 1;
    }
    this.maxEval = options.maxEvaluationsPerGroup ?? 50;
    // a flip-flop holds an unknown value until its first clock edge
    for (const gi of this.model.gates) if (nl.devices[gi].op === 'dff') this.gateOut[gi] = 3;
  }

  /** Value a control terminal sees: a driven net's value, a floating net's stored charge. */
  private read(net: number, reader: string): Mask {
    if (this.level[net] >= WEAK) return this.mask[net];
    // confirmed only if the net is still floating once the step has settled
    const list = this.pendingFloating.get(net) ?? [];
    if (!list.includes(reader) && list.length < 8) list.push(reader);
    this.pendingFloating.set(net, list);
    return this.charge[net] || 3;
  }

  private evalExpr(e: Expr, reader: string): Mask {
    switch (e.op) {
      case 'const':
        return e.value ? 2 : 1;
      case 'var': {
        const id = this.model.nl.netByName.get(e.name);
        return id === undefined ? 3 : this.read(id, reader);
      }
      case 'not': {
        const m = this.evalExpr(e.arg, reader);
        return ((m & 1) << 1) | ((m >> 1) & 1);
      }
      case 'and': {
        let can0 = 0;
        let can1 = 1;
        for (const a of e.args) {
          const m = this.evalExpr(a, reader);
          can0 |= m & 1;
          can1 &= (m >> 1) & 1;
        }
        return can0 | (can1 << 1);
      }
      case 'or': {
        let can0 = 1;
        let can1 = 0;
        for (const a of e.args) {
          const m = this.evalExpr(a, reader);
          can0 &= m & 1;
          can1 |= (m >> 1) & 1;
        }
        return can0 | (can1 << 1);
      }
      case 'xor': {
        let r = 1;
        for (const a of e.args) {
          const m = this.evalExpr(a, reader);
          if (m === 3 || r === 3) r = 3;
          else if (m === 2) r = r === 1 ? 2 : 1;
        }
        return r;
      }
      case 'implies':
        return this.evalExpr({ op: 'or', args: [{ op: 'not', arg: e.left }, e.right] }, reader);
      case 'iff':
        return this.evalExpr({ op: 'not', arg: { op: 'xor', args: [e.left, e.right] } }, reader);
    }
  }

  private evalGate(gi: number): Mask {
    const d = this.model.nl.devices[gi];
    const ins: Expr[] = d.terminals.slice(1).map((t) => ({ op: 'var', name: this.model.nl.nets[t].name }));
    const q: Expr = { op: 'var', name: this.model.nl.nets[d.terminals[0]].name };
    const f = gateFunction(d.op!, ins, q);
    if (d.op === 'pullup' || d.op === 'pulldown') return 0;
    if (f.enable) {
      const en = this.evalExpr(f.enable, d.name);
      if (en === 1) return 0;
      const val = this.evalExpr(f.value, d.name);
      return en === 2 ? val : 3;
    }
    if (d.op === 'dff') return this.mask[d.terminals[0]]; // edge-triggered: updated by the clock edge in applyEdge
    return this.evalExpr(f.value, d.name);
  }

  /** Strength propagation over one group; returns the nets whose value or strength changed. */
  private evaluateGroup(g: number): number[] {
    const m = this.model;
    const grp = m.groups[g];
    const nl = m.nl;
    const { level, mask, charge } = this;
    const oldLevel = grp.nets.map((n) => level[n]);
    const oldMask = grp.nets.map((n) => mask[n]);
    const edgeState = new Map<number, Mask>();
    for (const ei of grp.edges) {
      const e = m.edges[ei];
      let st: Mask = 2;
      if (e.control === 'nmos') st = this.read(e.gate, nl.devices[e.device].name);
      else if (e.control === 'pmos') {
        const r = this.read(e.gate, nl.devices[e.device].name);
        st = ((r & 1) << 1) | ((r >> 1) & 1);
      } else if (e.control === 'expr') st = this.evalExpr(e.expr!, nl.devices[e.device].name);
      edgeState.set(ei, st); // 1 = off, 2 = on, 3 = unknown
    }
    const pure0 = new Map<number, string>();
    const pure1 = new Map<number, string>();
    const injections = new Map<number, { lvl: number; m: Mask; by: string }[]>();
    for (const gi of grp.gates) {
      const d = nl.devices[gi];
      const out = d.terminals[0];
      let lvl = DRIVEN;
      let v = this.gateOut[gi];
      if (d.op === 'pullup' || d.op === 'pulldown') {
        lvl = WEAK;
        v = d.op === 'pullup' ? 2 : 1;
      }
      if (!v) continue;
      const list = injections.get(out) ?? [];
      list.push({ lvl, m: v, by: d.name });
      injections.set(out, list);
    }
    // wired nets of gate-level designs resolve their drivers before strengths do
    for (const [net, list] of injections) {
      const kind = nl.nets[net].kind;
      const strong = list.filter((x) => x.lvl === DRIVEN);
      if ((kind === 'wand' || kind === 'wor') && strong.length > 1) {
        const vals = strong.map((x) => x.m);
        const m0 = kind === 'wand' ? (vals.some((x) => x === 1) ? 1 : vals.every((x) => x === 2) ? 2 : 3) : vals.some((x) => x === 2) ? 2 : vals.every((x) => x === 1) ? 1 : 3;
        injections.set(net, [...list.filter((x) => x.lvl !== DRIVEN), { lvl: DRIVEN, m: m0, by: strong.map((x) => x.by).join('+') }]);
      }
    }
    const queue: number[] = [];
    const deliver = (n: number, lvl: number, mk: Mask, by: string, pure: boolean) => {
      if (level[n] > lvl) return;
      if (pure && mk === 1 && !pure0.has(n)) pure0.set(n, by);
      if (pure && mk === 2 && !pure1.has(n)) pure1.set(n, by);
      const next = (level[n] === lvl ? mask[n] : 0) | mk;
      if (level[n] === lvl && next === mask[n]) return;
      level[n] = lvl;
      mask[n] = next;
      queue.push(n);
    };
    const passes = (ei: number, from: number, mk: Mask): Mask => {
      const e = m.edges[ei];
      const st = edgeState.get(ei)!;
      if (st === 1) return 0;
      if (st === 3 && !includeX) return 0;
      let out = mk;
      if (e.oneWay) out &= from === e.a ? 2 : 1; // anode passes 1 down, cathode passes 0 up
      return out;
    };
    const srcMask = (n: number): Mask => (m.railValue.has(n) ? (m.railValue.get(n)! ? 2 : 1) : this.mask[n]);
    let includeX = false;
    const run = () => {
      for (const n of grp.nets) {
        level[n] = 0;
        mask[n] = 0;
      }
      for (const lvl of [DRIVEN, WEAK, CHARGE]) {
        pure0.clear();
        pure1.clear();
        // seeds: sources and stronger nets through edges that pass this level, injections, charge
        for (const ei of grp.edges) {
          const e = m.edges[ei];
          if (e.cap < lvl) continue;
          for (const [from, to] of [
            [e.a, e.b],
            [e.b, e.a],
          ]) {
            const fromIsSrc = m.groupOf[from] < 0;
            if (m.groupOf[to] < 0) continue;
            if (fromIsSrc || level[from] > lvl) {
              const sm = fromIsSrc ? srcMask(from) : mask[from];
              const pm = passes(ei, from, sm);
              if (pm) deliver(to, lvl, pm, nl.devices[e.device].name, pm !== 3 && edgeState.get(ei) === 2);
            }
          }
        }
        for (const [net, list] of injections) for (const x of list) if (x.lvl === lvl) deliver(net, lvl, x.m, x.by, x.m !== 3);
        if (lvl === CHARGE) for (const n of grp.nets) if (level[n] === 0 && charge[n]) deliver(n, CHARGE, charge[n], 'charge', false);
        while (queue.length) {
          const n = queue.pop()!;
          if (level[n] !== lvl) continue;
          for (const ei of m.edgesAt[n]) {
            const e = m.edges[ei];
            if (e.cap < lvl) continue;
            const to = e.a === n ? e.b : e.a;
            if (m.groupOf[to] < 0) continue;
            const pm = passes(ei, n, mask[n]);
            if (pm) deliver(to, lvl, pm, nl.devices[e.device].name, pm !== 3 && edgeState.get(ei) === 2 && mask[n] !== 3);
          }
        }
        if (lvl >= WEAK && !includeX) {
          for (const [n, by0] of pure0) {
            const by1 = pure1.get(n);
            if (by1 && level[n] === lvl) {
              this.pendingContention.set(n, [by0, by1]);
            }
          }
        }
      }
    };
    // Ternary evaluation: once with only the transistors surely on, once with the unknown ones
    // on too; a net whose two answers differ is X (an unknown switch only matters if it changes
    // something).
    run();
    const sureLevel = grp.nets.map((n) => level[n]);
    const sureMask = grp.nets.map((n) => mask[n]);
    if ([...edgeState.values()].includes(3)) {
      includeX = true;
      run();
      grp.nets.forEach((n, i) => {
        mask[n] |= sureMask[i];
        level[n] = Math.max(level[n], sureLevel[i]);
      });
    }
    const changed: number[] = [];
    grp.nets.forEach((n, i) => {
      if (level[n] >= WEAK) charge[n] = mask[n];
      else if (level[n] === CHARGE) charge[n] = mask[n];
      if (level[n] !== oldLevel[i] || mask[n] !== oldMask[i]) changed.push(n);
    });
    return changed;
  }

  /** Applies one input vector and settles the network; returns the step number. */
  apply(vector: Record<string, 0 | 1 | 'X'>): number {
    const m = this.model;
    this.step++;
    const first = this.step === 0;
    const groupQueue = new Set<number>();
    const gateQueue = new Set<number>();
    const touch = (net: number) => {
      for (const g of m.readers[net]) groupQueue.add(g);
      for (const gi of m.gateReaders[net]) gateQueue.add(gi);
    };
    // edge-triggered flip-flops sample d on the rising clock before anything else moves
    const dffUpdates: [number, Mask][] = [];
    for (const [name, value] of Object.entries(vector)) {
      const net = m.netIdsOf(name);
      if (!m.isInput[net]) throw InputError.at('simulate.not-input', `"${name}" is not one of the stimulus inputs`);
      const mk = maskOf(value);
      if (this.mask[net] !== mk || this.level[net] !== 4) {
        if (this.mask[net] === 1 && mk === 2) {
          for (const gi of m.gateReaders[net]) {
            const d = m.nl.devices[gi];
            if (d.op === 'dff' && d.terminals[2] === net) dffUpdates.push([gi, this.read(d.terminals[1], d.name)]);
          }
        }
        this.mask[net] = mk;
        this.level[net] = 4;
        touch(net);
      }
    }
    for (const [gi, mk] of dffUpdates) {
      this.gateOut[gi] = mk;
      const g = m.groupOf[m.nl.devices[gi].terminals[0]];
      if (g >= 0) groupQueue.add(g);
    }
    if (first) {
      m.groups.forEach((_, g) => groupQueue.add(g));
      for (const gi of m.gates) gateQueue.add(gi);
    }
    const evals = new Map<number, number>();
    const stuck = new Set<number>();
    while (groupQueue.size || gateQueue.size) {
      for (const gi of gateQueue) {
        gateQueue.delete(gi);
        const d = m.nl.devices[gi];
        if (d.op === 'dff') continue;
        const out = this.evalGate(gi);
        if (out !== this.gateOut[gi] || first) {
          this.gateOut[gi] = out;
          const g = m.groupOf[d.terminals[0]];
          if (g >= 0) groupQueue.add(g);
        }
      }
      for (const g of groupQueue) {
        groupQueue.delete(g);
        if (stuck.has(g)) continue;
        const count = (evals.get(g) ?? 0) + 1;
        evals.set(g, count);
        let changed = this.evaluateGroup(g);
        if (count > this.maxEval) {
          stuck.add(g);
          for (const n of m.groups[g].nets) {
            this.mask[n] = 3;
            this.level[n] = Math.max(this.level[n], WEAK);
          }
          changed = m.groups[g].nets;
          this.result.oscillations.push({ step: this.step, nets: m.groups[g].nets.slice(0, 8).map((n) => m.nl.nets[n].name) });
        }
        for (const n of changed) touch(n);
        if (gateQueue.size) break; // let gate outputs catch up before more groups move
      }
    }
    for (const [net, readers] of this.pendingFloating) {
      if (this.level[net] < WEAK) this.result.floatingReads.push({ net: m.nl.nets[net].name, step: this.step, readers });
    }
    for (const [net, drivers] of this.pendingContention) {
      if (this.mask[net] === 3 && this.level[net] >= WEAK) this.result.contention.push({ net: m.nl.nets[net].name, step: this.step, drivers });
    }
    this.pendingFloating.clear();
    this.pendingContention.clear();
    return this.step;
  }

  value(net: number): Level {
    if (this.level[net] < WEAK) return 'Z';
    return LEVELS[this.mask[net]];
  }
}

export function simulate(nl: FlatNetlist, stimulus: Stimulus, options: SimOptions = {}): SimResult {
  const steps = expandStimulus(stimulus);
  const inputs = [...new Set(steps.flatMap((v) => Object.keys(v)))];
  const sim = new SwitchSimulator(nl, inputs, options);
  const watch =
    options.watch ??
    (nl.nets.length <= 5000 ? nl.nets.filter((n) => !sim.model.railValue.has(n.id)).map((n) => n.name) : inputs);
  const ids = watch.map((n) => sim.model.netIdsOf(n));
  const codes = ids.map(() => new Uint8Array(steps.length));
  steps.forEach((vec, s) => {
    sim.apply(vec);
    ids.forEach((id, i) => {
      const v = sim.value(id);
      codes[i][s] = v === 'Z' ? 0 : v === 0 ? 1 : v === 1 ? 2 : 3;
    });
  });
  sim.result.steps = steps.length;
  watch.forEach((name, i) => {
    sim.result.waveforms[name] = Array.from(codes[i], (c) => LEVELS[c]);
  });
  return sim.result;
}
