// shared-control-driver: N gates computing the same function of the same control nets (one enable
// or strobe inverter per bit slice) become the fewest shared drivers whose fan-out, loaded high
// level and load base currents still pass; when none do, the one-driver rewrite is shown failing.
import { z } from 'zod';
import type { LogicNode } from '../extract/types';
import { exprToString, type Expr } from '../logic/expr';
import { checkEquivalence } from '../verify/equivalence';
import { defineRule } from './define-rule';
import { sharedDriverMargins } from './support/driver-margins';
import { deviceOwnerCounts, sameFunctionClasses } from './support/same-function';
import { NetIndex, mergeDriverLoads, type DriverLoads } from './support/net-index';
import { describePlaces } from './support/finding-words';
import { chunked, fewestParts, worstPerName, type Chunk } from './support/chunks';
import { emptyEdit, type Edit } from './types';

const OptionsSchema = z.object({
  /** Largest input count of the gates compared. */
  maxInputs: z.number().int().min(1).max(12),
  /** Fewest copies worth a finding. */
  minCopies: z.number().int().min(2),
});

export const sharedControlDriver = defineRule({
  id: 'shared-control-driver',
  meta: {
    description:
      'Finds gates that compute the same function of the same control nets (typically one enable or strobe inverter per bit slice) and proposes the fewest shared drivers that keep fan-out, loaded high level and load base currents.',
    messages: {
      share: '{count} copies of {function} on {inputs} ({where}) can be one shared driver for all {loads} loads',
      split: '{count} copies of {function} on {inputs} ({where}) can be {drivers} shared drivers; one driver for all {loads} loads fails {failed}',
      failing: '{count} copies of {function} on {inputs} ({where}) compute the same thing, but a shared driver fails {failed}; keeping them separate is what keeps the margins',
    },
    optionsSchema: OptionsSchema,
    defaultOptions: { maxInputs: 6, minCopies: 2 },
  },
  find(ctx, options) {
    const { netlist: nl, view } = ctx;
    const owners = deviceOwnerCounts(view, nl.devices.length);
    const classes = sameFunctionClasses(view, {
      maxInputs: options.maxInputs,
      minSize: options.minCopies,
      // Every device of a copy must be its own, or removing the copy would break another net.
      accept: (node) => node.groups.length === 1 && node.devices.every((d) => owners[d] === 1),
    });
    if (classes.length === 0) return;
    const index = new NetIndex(nl, view);
    for (const cls of classes) {
      const nodes = cls.members.map((i) => view.nodes[i]);
      const loads = new Map<number, DriverLoads>(cls.members.map((i) => [i, index.driverLoads(view.nodes[i].net)]));
      const before: Record<string, Expr> = Object.fromEntries(nodes.map((n) => [n.name, n.fn]));
      const after: Record<string, Expr> = Object.fromEntries(nodes.map((n) => [n.name, nodes[0].fn]));
      if (checkEquivalence(before, after).verdict !== 'proved') continue;

      const marginsFor = (chunks: Chunk[]) =>
        worstPerName(
          chunks.flatMap((ch) =>
            sharedDriverMargins(nl, view.nodes[ch.keep], mergeDriverLoads([ch.keep, ...ch.others].map((i) => loads.get(i)!)), ctx.margins),
          ),
        );
      const { parts: drivers, margins, single, passes } = fewestParts(cls.members, marginsFor);
      const chunks = chunked(cls.members, drivers);
      const totalLoads = [...loads.values()].reduce((s, l) => s + l.total, 0);
      const failed = single.filter((m) => m.status === 'fail').map((m) => m.name).join(', ');
      const data = {
        count: nodes.length,
        function: exprToString(cls.fn),
        inputs: cls.inputs.join(', '),
        where: describePlaces(nodes),
        loads: totalLoads,
        drivers,
        ...(failed ? { failed } : {}),
      };
      ctx.report({
        messageId: !passes ? 'failing' : drivers === 1 ? 'share' : 'split',
        data,
        location: {
          devices: nodes.flatMap((n) => n.devices.map((d) => nl.devices[d].name)),
          instances: [...new Set(nodes.map((n) => n.groups[0].path.join('.')).filter(Boolean))],
          nets: nodes.map((n) => n.name),
        },
        proposals: [
          {
            title:
              drivers === 1
                ? `Drive all ${nodes.length} loads of ${data.function} from ${nodes[0].name}`
                : `Share ${drivers} drivers of ${data.function} among ${nodes.length} copies`,
            edit: shareEdit(nl.devices, chunks.map((ch) => ({ keep: view.nodes[ch.keep], others: ch.others.map((i) => view.nodes[i]) }))),
            assumptions: [],
            margins,
          },
        ],
      });
    }
  },
});

/** Removes every copy but the kept one of each chunk and joins the copies' outputs to it. */
function shareEdit(devices: readonly { name: string }[], chunks: { keep: LogicNode; others: LogicNode[] }[]): Edit {
  const edit = emptyEdit();
  for (const ch of chunks) {
    for (const o of ch.others) {
      edit.removeDevices.push(...o.devices.map((d) => devices[d].name));
      edit.mergeNets.push({ keep: ch.keep.name, remove: o.name });
    }
  }
  return edit;
}
