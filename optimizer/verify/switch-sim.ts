// Switch-level simulation after Bryant, "A switch-level model and simulator for MOS digital
// systems", IEEE Trans. Computers C-33(2), 1984: values 0/1/X/Z, strengths rail > driven
// transistor > pull-up resistor > stored charge, contention → X, floating → Z with the charge kept.
// Event-driven: a group is re-evaluated only when a net it reads changes, in topological rank order;
// each step iterates to a fixed point with a bound, and a group that keeps changing is set to X.
import { InputError } from '../errors';
import type { FlatNetlist } from '../netlist/ir';
import type { Expr } from '../logic/expr';
import { gateFunction } from '../extract/gates';
import { ternaryExpr, type Mask } from './ternary';
import { LowestFirstQueue } from './rank-queue';
import * as M from './switch-model';
import type { SwitchModel } from './switch-model';

// Copied into module constants once: a transpiled named import is read through a getter on every
// use, and these are read in the innermost loops.
const { buildSwitchModel, BLEED, CHARGE, CTL_EXPR, CTL_NMOS, CTL_PMOS, DRIVEN, OP_AND, OP_CONST, OP_END, OP_NET, OP_NOT, OP_OR, RAIL, WEAK } = M;

const PASSES = [DRIVEN, WEAK, BLEED, CHARGE] as const;

export type Level = 0 | 1 | 'X' | 'Z';

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
    // per-net and per-group state from the model's arena (switch-model.ts): no further buffers
    const alloc = this.model.alloc;
    this.level = alloc.u8(n);
    this.mask = alloc.u8(n).fill(3);
    this.charge = alloc.u8(n).fill(3);
    this.gateOut = alloc.u8(nl.devices.length);
    for (const [net, v] of this.model.railValue) {
      this.level[this.model.netPos[net]] = RAIL;
      this.mask[this.model.netPos[net]] = v ? 2 : 1;
    }
    this.maxEval = options.maxEvaluationsPerGroup ?? 50;
    // a flip-flop holds an unknown value until its first clock edge
    for (const gi of this.model.gates) if (nl.devices[gi].op === 'dff') this.gateOut[gi] = 3;
    this.evalCount = alloc.i32(this.model.groupCount);
    this.evalStep = alloc.i32(this.model.groupCount).fill(-1);
    // Per-evaluation scratch is bounded by the largest group, not the design: an evaluation
    // touches only its own group's nets.
    const off = this.model.groupNetOff;
    let widest = 0;
    for (let g = 0; g < this.model.groupCount; g++) widest = Math.max(widest, off[g + 1] - off[g]);
    this.widestGroup = widest;
    this.changed = new Int32Array(widest);
  }

  /** Value a control terminal sees: a driven net's value, a floating net's stored charge. */
  private read(net: number, reader: number): Mask {
    if (this.level[net] >= BLEED) return this.mask[net];
    // confirmed only if the net is still floating once the step has settled
    const name = this.model.nl.devices[reader].name;
    const list = this.pendingFloating.get(net) ?? [];
    if (!list.includes(name) && list.length < 8) list.push(name);
    this.pendingFloating.set(net, list);
    return this.charge[net] || 3;
  }

  private evalExpr(e: Expr, reader: number): Mask {
    return ternaryExpr(e, (name) => {
      const id = this.model.nl.netByName.get(name);
      return id === undefined ? 3 : this.read(this.model.netPos[id], reader);
    });
  }

  /**
   * Three-valued evaluation of a bipolar base drive's program (postfix, on a small stack): no
   * closure or array per evaluation, since it runs for every bipolar switch of every group update.
   */
  private evalProgram(pc: number, reader: number): Mask {
    const code = this.model.code;
    const st = this.evalStack;
    let sp = 0;
    for (;;) {
      const op = code[pc];
      const arg = code[pc + 1];
      pc += 2;
      if (op === OP_NET) st[sp++] = this.read(arg, reader);
      else if (op === OP_CONST) st[sp++] = arg;
      else if (op === OP_NOT) {
        const m = st[sp - 1];
        st[sp - 1] = ((m & 1) << 1) | ((m >> 1) & 1);
      } else if (op === OP_END) return st[0];
      else {
        // and / or / xor over the top `arg` entries, as ternary.ts defines them
        let r: number;
        const from = sp - arg;
        if (op === OP_AND) {
          let can0 = 0;
          let can1 = 1;
          for (let i = from; i < sp; i++) {
            can0 |= st[i] & 1;
            can1 &= (st[i] >> 1) & 1;
          }
          r = arg === 1 ? st[from] : can0 | (can1 << 1);
        } else if (op === OP_OR) {
          let can0 = 1;
          let can1 = 0;
          for (let i = from; i < sp; i++) {
            can0 &= st[i] & 1;
            can1 |= (st[i] >> 1) & 1;
          }
          r = arg === 1 ? st[from] : can0 | (can1 << 1);
        } else {
          r = 1;
          for (let i = from; i < sp; i++) {
            const m = st[i];
            if (m === 3 || r === 3) r = 3;
            else if (m === 2) r = r === 1 ? 2 : 1;
          }
        }
        sp = from;
        st[sp++] = r;
      }
    }
  }

  private evalGate(gi: number): Mask {
    const d = this.model.nl.devices[gi];
    const ins: Expr[] = d.terminals.slice(1).map((t) => ({ op: 'var', name: this.model.nl.nets[t].name }));
    const q: Expr = { op: 'var', name: this.model.nl.nets[d.terminals[0]].name };
    const f = gateFunction(d.op!, ins, q);
    if (d.op === 'pullup' || d.op === 'pulldown') return 0;
    if (f.enable) {
      const en = this.evalExpr(f.enable, gi);
      if (en === 1) return 0;
      const val = this.evalExpr(f.value, gi);
      return en === 2 ? val : 3;
    }
    if (d.op === 'dff') return this.mask[this.model.netPos[d.terminals[0]]]; // edge-triggered: updated by the clock edge in applyEdge
    return this.evalExpr(f.value, gi);
  }

  // Scratch space reused by every group evaluation (no allocation per evaluation).
  private edgeSt!: Uint8Array;
  private sureLevel!: Uint8Array;
  private sureMask!: Uint8Array;
  private oldLevel!: Uint8Array;
  private oldMask!: Uint8Array;
  private pure0!: Int32Array;
  private pure1!: Int32Array;
  private pureTouched!: Int32Array;
  private nTouched = 0;
  /** First net of the group being propagated (pure0/pure1 are indexed from it). */
  private groupStart = 0;
  private evalStack!: Uint8Array;
  /** Evaluations of each group in the current step (valid where evalStep is the step). */
  private readonly evalCount: Int32Array;
  private readonly evalStep: Int32Array;
  /** Nets whose value or strength the last group evaluation changed. */
  private readonly changed: Int32Array;
  private nChanged = 0;
  /** Nets in the largest group. */
  private readonly widestGroup: number;
  private stack!: Int32Array;
  private top = 0;
  private queue?: LowestFirstQueue;
  private curLevel = 0;
  private tracking = false;

  private scratch(): void {
    if (this.stack) return;
    this.edgeSt = this.model.alloc.u8(this.model.edgeCount);
    // a net enters pureTouched once per pure value, and the stack once per rise in strength or
    // growth of its value mask: at most twice per net of the group in one strength pass
    this.pureTouched = new Int32Array(2 * this.widestGroup);
    // a program pushes at most once per instruction: the longest one bounds the stack
    const code = this.model.code;
    let longest = 0;
    for (let pc = 0, start = 0; pc < code.length; pc += 2) {
      if (code[pc] !== OP_END) continue;
      longest = Math.max(longest, (pc - start) / 2);
      start = pc + 2;
    }
    this.evalStack = new Uint8Array(longest + 1);
    // saved values of the group being evaluated, by position in its range of nets
    this.sureLevel = new Uint8Array(this.widestGroup);
    this.sureMask = new Uint8Array(this.widestGroup);
    this.oldLevel = new Uint8Array(this.widestGroup);
    this.oldMask = new Uint8Array(this.widestGroup);
    // by position in the group being evaluated, as the saved values are
    this.pure0 = new Int32Array(this.widestGroup);
    this.pure1 = new Int32Array(this.widestGroup);
    this.stack = new Int32Array(2 * this.widestGroup + 1);
  }

  private deliver(n: number, mk: Mask, dev: number, pure: boolean): void {
    const lvl = this.curLevel;
    const level = this.level;
    if (level[n] > lvl) return;
    if (pure && this.tracking) {
      const i = n - this.groupStart;
      if (mk === 1 && this.pure0[i] === 0) {
        this.pure0[i] = dev + 1;
        this.pureTouched[this.nTouched++] = n;
      } else if (mk === 2 && this.pure1[i] === 0) {
        this.pure1[i] = dev + 1;
        this.pureTouched[this.nTouched++] = n;
      }
    }
    const next = (level[n] === lvl ? this.mask[n] : 0) | mk;
    if (level[n] === lvl && next === this.mask[n]) return;
    level[n] = lvl;
    this.mask[n] = next;
    this.stack[this.top++] = n;
  }

  /** One strength-propagation pass over a group; unknown switches conduct only when includeX. */
  private propagate(g: number, includeX: boolean): void {
    const m = this.model;
    const { level, mask, charge, edgeSt } = this;
    const { edgeA, edgeB, edgeCap, edgeOneWay, edgeDevice, groupOf, railVal, netPos } = m;
    // the group's nets and edges are ranges of model ids (switch-layout.ts)
    const n0 = m.groupNetOff[g];
    const n1 = m.groupNetOff[g + 1];
    this.groupStart = n0;
    const e0 = m.groupEdgeOff[g];
    const e1 = m.groupEdgeOff[g + 1];
    const gates = m.groupGates.list;
    const g0 = m.groupGates.off[g];
    const g1 = m.groupGates.off[g + 1];
    const at = m.edgesAt;
    const nl = m.nl;
    for (let n = n0; n < n1; n++) {
      level[n] = 0;
      mask[n] = 0;
    }
    this.tracking = !includeX;
    for (const lvl of PASSES) {
      if (lvl !== DRIVEN) {
        // once every net of the group holds a stronger signal, this pass and the weaker ones can
        // deliver nothing (deliver ignores nets above the pass's level): most groups end early
        let open = false;
        for (let n = n0; n < n1; n++) {
          if (level[n] <= lvl) {
            open = true;
            break;
          }
        }
        if (!open) break;
      }
      this.curLevel = lvl;
      this.top = 0;
      for (let ei = e0; ei < e1; ei++) {
        const st = edgeSt[ei];
        if (edgeCap[ei] < lvl || st === 1 || (st === 3 && !includeX)) continue;
        for (let side = 0; side < 2; side++) {
          const from = side ? edgeB[ei] : edgeA[ei];
          const to = side ? edgeA[ei] : edgeB[ei];
          if (groupOf[to] < 0) continue;
          const fromIsSrc = groupOf[from] < 0;
          if (!fromIsSrc && level[from] <= lvl) continue;
          const rv = railVal[from];
          let mk = fromIsSrc && rv >= 0 ? rv + 1 : mask[from];
          if (edgeOneWay[ei]) mk &= side === 0 ? 2 : 1; // the anode passes a 1 down, the cathode a 0 up
          if (mk) this.deliver(to, mk, edgeDevice[ei], mk !== 3 && st === 2);
        }
      }
      for (let k = g0; k < g1; k++) {
        const gi = gates[k];
        const d = nl.devices[gi];
        const weak = d.op === 'pullup' || d.op === 'pulldown';
        if ((weak ? WEAK : DRIVEN) !== lvl) continue;
        const out = netPos[d.terminals[0]];
        const mk = weak ? (d.op === 'pullup' ? 2 : 1) : this.gateOut[gi];
        if (!mk) continue;
        const kind = nl.nets[d.terminals[0]].kind;
        if (!weak && (kind === 'wand' || kind === 'wor') && level[out] === lvl) {
          // wired nets of gate-level designs resolve their drivers instead of fighting
          const a = mask[out];
          const both = kind === 'wand' ? (a === 1 || mk === 1 ? 1 : a === 2 && mk === 2 ? 2 : 3) : a === 2 || mk === 2 ? 2 : a === 1 && mk === 1 ? 1 : 3;
          mask[out] = both;
          continue;
        }
        this.deliver(out, mk, gi, mk !== 3 && kind !== 'wand' && kind !== 'wor');
      }
      if (lvl === CHARGE) {
        for (let n = n0; n < n1; n++) if (level[n] === 0 && charge[n]) this.deliver(n, charge[n], -1, false);
      }
      while (this.top > 0) {
        const n = this.stack[--this.top];
        if (level[n] !== lvl) continue;
        const mn = mask[n];
        for (let k = at.off[n], kEnd = at.off[n + 1]; k < kEnd; k++) {
          const ei = at.list[k];
          const st = edgeSt[ei];
          if (edgeCap[ei] < lvl || st === 1 || (st === 3 && !includeX)) continue;
          const a = edgeA[ei];
          const to = a === n ? edgeB[ei] : a;
          if (groupOf[to] < 0) continue;
          let mk = mn;
          if (edgeOneWay[ei]) mk &= a === n ? 2 : 1;
          if (mk) this.deliver(to, mk, edgeDevice[ei], mk !== 3 && st === 2);
        }
      }
      if (this.tracking) {
        for (let i = 0; i < this.nTouched; i++) {
          const n = this.pureTouched[i];
          const at = n - n0;
          if (this.pure0[at] && this.pure1[at] && level[n] === lvl && lvl >= WEAK) {
            this.pendingContention.set(n, [this.pure0[at], this.pure1[at]].map((d) => nl.devices[d - 1].name));
          }
          this.pure0[at] = 0;
          this.pure1[at] = 0;
        }
        this.nTouched = 0;
      }
    }
  }

  /** Ternary evaluation of one group; records in `changed` the nets whose value or strength changed. */
  private evaluateGroup(g: number): void {
    this.scratch();
    const m = this.model;
    const nl = m.nl;
    const { level, mask, charge, edgeSt, oldLevel, oldMask } = this;
    // the group's nets are a range of model ids; the saved values are kept per position in it
    const n0 = m.groupNetOff[g];
    const n1 = m.groupNetOff[g + 1];
    for (let k = m.groupGates.off[g]; k < m.groupGates.off[g + 1]; k++) {
      const gi = m.groupGates.list[k];
      if (nl.devices[gi].op !== 'dff') this.gateOut[gi] = this.evalGate(gi);
    }
    // controls are read before the group's own nets are cleared (a gate may sit in its own group)
    let unknown = false;
    const { edgeControl, edgeGate, edgeDevice } = m;
    for (let ei = m.groupEdgeOff[g], eEnd = m.groupEdgeOff[g + 1]; ei < eEnd; ei++) {
      const control = edgeControl[ei];
      let st: Mask = 2;
      if (control === CTL_NMOS) st = this.read(edgeGate[ei], edgeDevice[ei]);
      else if (control === CTL_PMOS) {
        const r = this.read(edgeGate[ei], edgeDevice[ei]);
        st = ((r & 1) << 1) | ((r >> 1) & 1);
      } else if (control === CTL_EXPR) st = this.evalProgram(m.programAt[ei], edgeDevice[ei]);
      edgeSt[ei] = st; // 1 = off, 2 = on, 3 = unknown
      if (st === 3) unknown = true;
    }
    for (let n = n0; n < n1; n++) {
      oldLevel[n - n0] = level[n];
      oldMask[n - n0] = mask[n];
    }
    this.propagate(g, false);
    if (unknown) {
      // Ternary evaluation: once with only the switches surely on, once with the unknown ones on
      // too; a net whose two answers differ is X (an unknown switch matters only if it changes
      // something).
      const { sureLevel, sureMask } = this;
      for (let n = n0; n < n1; n++) {
        sureLevel[n - n0] = level[n];
        sureMask[n - n0] = mask[n];
      }
      this.propagate(g, true);
      for (let n = n0; n < n1; n++) {
        mask[n] |= sureMask[n - n0];
        if (sureLevel[n - n0] > level[n]) level[n] = sureLevel[n - n0];
      }
    }
    for (let n = n0; n < n1; n++) {
      if (level[n] >= CHARGE) charge[n] = mask[n];
      if (level[n] !== oldLevel[n - n0] || mask[n] !== oldMask[n - n0]) this.changed[this.nChanged++] = n;
    }
  }

  /** Applies one input vector and settles the network in unit-delay waves; returns the step. */
  apply(vector: Record<string, 0 | 1 | 'X'>): number {
    const m = this.model;
    this.step++;
    const first = this.step === 0;
    const queue = (this.queue ??= new LowestFirstQueue(m.groupCount));
    // edge-triggered flip-flops sample d on the rising clock before anything else moves
    const dffUpdates: [number, Mask][] = [];
    for (const [name, value] of Object.entries(vector)) {
      const id = m.netIdsOf(name);
      const net = m.netPos[id];
      if (!m.isInput[net]) throw InputError.at('simulate.not-input', `"${name}" is not one of the stimulus inputs`);
      const mk = maskOf(value);
      if (this.mask[net] !== mk || this.level[net] !== RAIL) {
        if (this.mask[net] === 1 && mk === 2) {
          for (let k = m.gateReaders.off[net]; k < m.gateReaders.off[net + 1]; k++) {
            const gi = m.gateReaders.list[k];
            const d = m.nl.devices[gi];
            if (d.op === 'dff' && d.terminals[2] === id) dffUpdates.push([gi, this.read(m.netPos[d.terminals[1]], gi)]);
          }
        }
        this.mask[net] = mk;
        this.level[net] = RAIL;
        for (let k = m.readers.off[net]; k < m.readers.off[net + 1]; k++) queue.push(m.readers.list[k]);
      }
    }
    for (const [gi, mk] of dffUpdates) {
      this.gateOut[gi] = mk;
      const g = m.groupOf[m.netPos[m.nl.devices[gi].terminals[0]]];
      if (g >= 0) queue.push(g);
    }
    if (first) for (let g = 0; g < m.groupCount; g++) queue.push(g);
    // Rank-ordered worklist (group ids are topological ranks; lowest first): each group of acyclic logic
    // settles in one evaluation; loops iterate up to the bound. Counts are per step (evalStep
    // says which step a group's count belongs to); a stuck group's count stays above the bound.
    const { evalCount, evalStep, changed } = this;
    const step = this.step;
    const { off: rOff, list: rList } = m.readers;
    while (queue.size) {
      const g = queue.pop();
      if (evalStep[g] !== step) {
        evalStep[g] = step;
        evalCount[g] = 0;
      }
      if (evalCount[g] > this.maxEval) continue; // stuck: already set to X this step
      const count = ++evalCount[g];
      this.nChanged = 0;
      if (count > this.maxEval) {
        const n0 = m.groupNetOff[g];
        const n1 = m.groupNetOff[g + 1];
        for (let n = n0; n < n1; n++) {
          this.mask[n] = 3;
          this.charge[n] = 3;
          this.level[n] = Math.max(this.level[n], WEAK);
          changed[this.nChanged++] = n;
        }
        this.result.oscillations.push({ step, nets: Array.from(m.netAt.subarray(n0, Math.min(n1, n0 + 8)), (n) => m.nl.nets[n].name) });
      } else this.evaluateGroup(g);
      for (let i = 0; i < this.nChanged; i++) {
        const n = changed[i];
        for (let k = rOff[n], kEnd = rOff[n + 1]; k < kEnd; k++) queue.push(rList[k]);
      }
    }
    for (const [net, readers] of this.pendingFloating) {
      if (this.level[net] < BLEED) this.result.floatingReads.push({ net: m.nl.nets[m.netAt[net]].name, step: this.step, readers });
    }
    for (const [net, drivers] of this.pendingContention) {
      if (this.mask[net] === 3 && this.level[net] >= WEAK) this.result.contention.push({ net: m.nl.nets[m.netAt[net]].name, step: this.step, drivers });
    }
    this.pendingFloating.clear();
    this.pendingContention.clear();
    return this.step;
  }

  /** A net's value, by netlist id. */
  value(net: number): Level {
    return LEVELS[this.levelCode(net)];
  }

  /** The net's value (netlist id) as an index into LEVELS (0 = Z, else the value mask), for compact recording. */
  levelCode(net: number): number {
    const n = this.model.netPos[net];
    return this.level[n] < BLEED ? 0 : this.mask[n];
  }
}

export function simulate(nl: FlatNetlist, stimulus: Stimulus, options: SimOptions = {}): SimResult {
  const steps = expandStimulus(stimulus);
  const inputs = [...new Set(steps.flatMap((v) => Object.keys(v)))];
  const sim = new SwitchSimulator(nl, inputs, options);
  const watch =
    options.watch ??
    (nl.nets.length <= 5000 ? nl.nets.filter((n) => sim.model.railVal[sim.model.netPos[n.id]] < 0).map((n) => n.name) : inputs);
  const ids = watch.map((n) => sim.model.netIdsOf(n));
  // one row of level codes per step, read back per net below
  const nIds = ids.length;
  const codes = new Uint8Array(nIds * steps.length);
  for (let s = 0; s < steps.length; s++) {
    sim.apply(steps[s]);
    for (let i = 0; i < nIds; i++) codes[s * nIds + i] = sim.levelCode(ids[i]);
  }
  sim.result.steps = steps.length;
  watch.forEach((name, i) => {
    const wave: Level[] = new Array(steps.length);
    for (let s = 0; s < steps.length; s++) wave[s] = LEVELS[codes[s * nIds + i]];
    sim.result.waveforms[name] = wave;
  });
  return sim.result;
}
