// two-level-minimise: re-synthesises a fanout-free combinational cone as the minimised sum of
// products of its function (the stated assumptions over its inputs become don't-cares), mapped
// to the family's cheapest two-level form, and proposes it when it takes fewer parts.
import { z } from 'zod';
import { GROUND } from '../netlist/ir';
import { editSavings } from '../cost/cost';
import { and, support, type Expr } from '../logic/expr';
import type { MapFamily } from '../logic/family-parts';
import { mapCover } from '../logic/map-family';
import { coverToText } from '../logic/cubes';
import { complementTable, fromNetwork, type TruthTable } from '../logic/truth-table';
import { minimiseAll, type MinimiseOutcome, type MinimiseResult } from '../logic/minimiser';
import { fanOut } from '../margins/line';
import { worstOf } from '../margins/corners';
import { emitNetwork, type EmitContext } from '../rewrite/emit-gates';
import { defineRule } from './define-rule';
import { fanoutFreeCones, readersOf, type Cone } from './lib/cones';
import type { Assumption, RuleContext } from './types';

const OptionsSchema = z.object({
  /** Largest cone input count minimised (2^n truth-table rows). */
  maxInputs: z.number().int().min(2).max(16),
  /** Per-function limit on the minimiser. */
  timeoutMs: z.number().int().min(100).max(600_000),
});

const FAMILIES: readonly MapFamily[] = ['rtl', 'dtl', 'cmos', 'nmos', 'gate'];

/** The highest positive rail, which new gates' loads return to (none in a gate-level design). */
function highRail(ctx: RuleContext) {
  return [...ctx.netlist.rails].filter((r) => r.volts > 0).sort((a, b) => b.volts - a.volts)[0];
}

/** Values, models and rails for new gates, taken from the devices being replaced. */
function emitContext(ctx: RuleContext, cone: Cone, high: ReturnType<typeof highRail>): EmitContext | undefined {
  const nl = ctx.netlist;
  const devs = cone.devices.map((d) => nl.devices[d]);
  const modelOf = (kind: string) => devs.find((d) => d.kind === kind)?.model;
  const pullUp = cone.nodes.find((n) => n.pullUp?.ohms)?.pullUp;
  if (!high && cone.root.family !== 'gate') return undefined;
  const bases = cone.nodes.flatMap((n) => n.groups.flatMap((g) => g.bases));
  const baseOhms = bases.flatMap((b) => b.baseResistors.map((r) => r.ohms)).find((x) => x !== undefined);
  const dp = bases.find((b) => b.diodePullUp?.ohms)?.diodePullUp?.ohms;
  const bleed = bases.find((b) => b.bleed !== undefined)?.bleed;
  const paramsOf = (kind: string) => devs.find((d) => d.kind === kind)?.params;
  return {
    prefix: `${cone.root.name}.TLM`,
    vcc: high ? nl.nets[high.net].name : '',
    gnd: GROUND,
    path: [...(cone.nodes[0].groups[0]?.path ?? [])],
    models: { npn: modelOf('npn'), nmos: modelOf('nmos'), pmos: modelOf('pmos'), diode: modelOf('diode') },
    mosParams: { nmos: paramsOf('nmos'), pmos: paramsOf('pmos') },
    // Fall back to common DTL/RTL values only where the replaced gates give none.
    ohms: {
      load: pullUp?.ohms ?? 2000,
      base: baseOhms ?? 4700,
      diodePullUp: dp ?? 2000,
      bleed: bleed !== undefined ? (nl.devices[bleed].value ?? 5000) : 5000,
    },
    existing: new Set([...cone.leaves, cone.root.name]),
  };
}

/** A block worth minimising, with the indices of its tables in the batch sent to the minimiser. */
interface Candidate {
  cone: Cone;
  family: MapFamily;
  usable: Assumption[];
  plain: number;
  assumed?: number;
}

/** Truth-table words the tables of one batch may hold (bounds memory on large designs). */
const BATCH_WORDS = 1 << 20;

/**
 * The block's function and its complement as one two-output table (both minimised together),
 * with the assumptions as don't-cares; evaluated gate by gate, so a deep chain never recurses.
 */
function coneTables(cone: Cone, steps: readonly { name: string; fn: Expr }[], assumptions: Assumption[]): TruthTable {
  const table = fromNetwork(cone.leaves, steps, cone.root.name, assumptions.length ? and(...assumptions.map((a) => a.expr)) : undefined);
  return { inputs: table.inputs, outputs: [table.outputs[0], { ...complementTable(table).outputs[0], name: `${cone.root.name}'` }] };
}

/** The family network of a minimised block; undefined when it maps to a wire or constant. */
function mapped(root: string, r: MinimiseResult, family: MapFamily) {
  const on = { inputs: r.cover.inputs, outputs: [r.cover.outputs[0]] };
  const off = { inputs: r.cover.inputs, outputs: [{ ...r.cover.outputs[1], name: root }] };
  const network = mapCover(on, family, { complement: off });
  if (network.outputs.some((o) => o.form === 'wire' || o.form === 'constant')) return undefined;
  return { network, cover: on };
}

export const twoLevelMinimise = defineRule({
  id: 'two-level-minimise',
  meta: {
    description:
      'Replaces a combinational block by its minimised two-level form (Espresso, with the assumptions as don\'t-cares) in the family\'s cheapest gates, when that takes fewer parts.',
    messages: {
      smaller: 'the logic driving {net} ({inputs} inputs, {before} parts) can be built as {form} of {after} parts: {sop}',
      smallerAssuming: 'the logic driving {net} ({inputs} inputs, {before} parts) can be built as {form} of {after} parts while {assumptions} hold: {sop}',
    },
    optionsSchema: OptionsSchema,
    defaultOptions: { maxInputs: 8, timeoutMs: 10_000 },
  },
  async find(ctx, options) {
    const nl = ctx.netlist;
    const view = ctx.view;
    const ports = new Set(nl.ports.map((p) => nl.nets[p].name));
    const readers = readersOf(view);
    const high = highRail(ctx);
    const failed = (cone: Cone, err: unknown) =>
      ctx.reportError(cone.root.name, `could not minimise the block driving ${cone.root.name}: ${err instanceof Error ? err.message : String(err)}`);

    // Blocks are gathered, then minimised in batches (one round trip to the minimiser per batch,
    // each distinct function once), then mapped and reported in the order they were found.
    let batch: Candidate[] = [];
    let tables: TruthTable[] = [];
    let words = 0;
    const flush = async () => {
      const outcomes = await minimiseAll(ctx.minimiser, tables, { timeoutMs: options.timeoutMs });
      for (const c of batch) report(c, outcomes[c.plain], c.assumed === undefined ? undefined : outcomes[c.assumed]);
      batch = [];
      tables = [];
      words = 0;
    };
    // A block of one input is a wire or an inverter: nothing to minimise.
    for (const cone of fanoutFreeCones(view, options.maxInputs, ports, readers, 2)) {
      const family = cone.root.family;
      if (!FAMILIES.includes(family) || cone.nodes.some((n) => n.family !== family)) continue;
      // New gates need a supply rail (emitContext's only refusal, checked before any work).
      if (!high && family !== 'gate') continue;
      const leafSet = new Set(cone.leaves);
      const usable = ctx.assumptions.filter((a) => [...support(a.expr)].every((x) => leafSet.has(x)));
      let plain: TruthTable;
      let assumed: TruthTable | undefined;
      try {
        const steps = [...cone.nodes].reverse();
        plain = coneTables(cone, steps, []);
        assumed = usable.length ? coneTables(cone, steps, usable) : undefined;
      } catch (err) {
        failed(cone, err);
        continue;
      }
      batch.push({ cone, family, usable, plain: tables.push(plain) - 1, ...(assumed ? { assumed: tables.push(assumed) - 1 } : {}) });
      words += (assumed ? 8 : 4) * plain.outputs[0].on.length;
      if (words >= BATCH_WORDS) await flush();
    }
    if (batch.length) await flush();

    function report({ cone, family, usable }: Candidate, plainOutcome: MinimiseOutcome, assumedOutcome: MinimiseOutcome | undefined): void {
      let plain;
      let assumed;
      try {
        // A minimiser timeout or failure skips this block only; the scan records it.
        if (!plainOutcome.ok) throw plainOutcome.error;
        if (assumedOutcome && !assumedOutcome.ok) throw assumedOutcome.error;
        plain = mapped(cone.root.name, plainOutcome.result, family);
        assumed = assumedOutcome?.ok ? mapped(cone.root.name, assumedOutcome.result, family) : undefined;
      } catch (err) {
        failed(cone, err);
        return;
      }
      // Rely on assumptions only when they buy something over the plain minimum.
      const pick = assumed && (!plain || assumed.network.parts.transistors + assumed.network.parts.resistors + assumed.network.parts.diodes <
        plain.network.parts.transistors + plain.network.parts.resistors + plain.network.parts.diodes) ? { ...assumed, relies: usable } : plain && { ...plain, relies: [] as Assumption[] };
      if (!pick) return;
      const cx = emitContext(ctx, cone, high);
      if (!cx) return;
      let added;
      try {
        added = emitNetwork(pick.network, family, cx);
      } catch {
        return; // a family model the block lacks (e.g. no diode model): nothing to build with
      }
      const edit = { removeDevices: cone.devices.map((d) => nl.devices[d].name), addDevices: added, reconnect: [], mergeNets: [] };
      const savings = editSavings(nl, edit, family === 'gate' ? ctx.targetFamily : family);
      const discrete = savings.transistors + savings.resistors + savings.diodes;
      if (discrete < 0 || (discrete === 0 && savings.gates <= 0)) return;
      const before = cone.devices.length;
      const after = added.length;
      // Fan-out of each leaf whose load count the rewrite raises (an overload it does not worsen is
      // not this rewrite's doing): readers outside the block plus the new gates that read it.
      // Readers inside are counted from the block's own nodes, so a leaf read by thousands of
      // other blocks (a shared control line) costs nothing extra here.
      const readsInside = new Map<string, number>();
      for (const n of cone.nodes) for (const x of n.inputs) readsInside.set(x, (readsInside.get(x) ?? 0) + 1);
      const margins = cone.leaves.flatMap((leaf) => {
        const all = readers.get(leaf) ?? [];
        const outside = all.length - (readsInside.get(leaf) ?? 0);
        const inside = pick.network.gates.filter((g) => g.inputs.includes(leaf)).length;
        return outside + inside > all.length ? [fanOut({ loads: outside + inside, family }, ctx.margins)] : [];
      });
      const worst = worstOf(margins);
      const data = {
        net: cone.root.name,
        inputs: cone.leaves.length,
        before,
        after,
        form: family === 'rtl' || (family !== 'dtl' && pick.network.gates.some((g) => g.op === 'nor')) ? 'NOR–NOR' : 'NAND–NAND',
        sop: coverToText(pick.cover.outputs[0].cover, cone.leaves),
        ...(pick.relies.length ? { assumptions: pick.relies.map((a) => a.id).join(', ') } : {}),
      };
      ctx.report({
        messageId: pick.relies.length ? 'smallerAssuming' : 'smaller',
        data,
        location: { devices: edit.removeDevices, instances: [...new Set(cone.nodes.map((n) => n.groups[0]?.path.join('.') ?? '').filter(Boolean))], nets: [cone.root.name, ...cone.leaves] },
        proposals: [{ title: `rebuild ${cone.root.name} as ${data.form}`, edit, assumptions: pick.relies.map((a) => a.id), margins: worst ? [worst] : [] }],
      });
    }
  },
});
