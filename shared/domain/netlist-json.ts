// The product's own netlist file: a versioned JSON envelope around the netlist IR
// (optimizer/netlist/ir.ts), validated with zod on both client and server.
import { z } from 'zod';

export const NETLIST_JSON_FORMAT = 'trimwire-netlist';
export const NETLIST_JSON_VERSION = 1;

export const SourceLocSchema = z.object({
  file: z.string(),
  line: z.number().int().min(1),
  col: z.number().int().min(1),
});

export const DeviceKindSchema = z.enum(['npn', 'pnp', 'nmos', 'pmos', 'resistor', 'capacitor', 'diode', 'vsource', 'isource', 'gate']);

export const GateOpSchema = z.enum([
  'buf', 'not', 'and', 'or', 'nand', 'nor', 'xor', 'xnor',
  'bufif0', 'bufif1', 'notif0', 'notif1', 'pullup', 'pulldown', 'latch', 'dff',
]);

const ParamValueSchema = z.union([z.number().finite(), z.string()]);
const ParamsSchema = z.record(z.string(), ParamValueSchema);
const NetName = z.string().min(1, 'a net name cannot be empty');

/** Terminal counts per kind (and per gate op), as the IR fixes them. */
const TERMINALS: Record<string, [number, number]> = {
  npn: [3, 4], pnp: [3, 4], nmos: [3, 4], pmos: [3, 4],
  resistor: [2, 2], capacitor: [2, 2], diode: [2, 2], vsource: [2, 2], isource: [2, 2],
};
const GATE_TERMINALS: Record<string, [number, number]> = {
  buf: [2, 2], not: [2, 2], bufif0: [3, 3], bufif1: [3, 3], notif0: [3, 3], notif1: [3, 3],
  pullup: [1, 1], pulldown: [1, 1], latch: [3, 3], dff: [3, 3],
};

export const DeviceSchema = z
  .object({
    name: z.string().min(1),
    kind: DeviceKindSchema,
    op: GateOpSchema.optional(),
    terminals: z.array(NetName),
    value: z.number().finite().optional(),
    model: z.string().min(1).optional(),
    params: ParamsSchema.default({}),
    waveform: z.string().optional(),
    loc: SourceLocSchema.optional(),
  })
  .superRefine((d, ctx) => {
    if (d.kind === 'gate' && d.op === undefined) ctx.addIssue({ code: 'custom', path: ['op'], message: 'a gate needs an op' });
    if (d.kind !== 'gate' && d.op !== undefined) ctx.addIssue({ code: 'custom', path: ['op'], message: `only gates have an op, not ${d.kind}` });
    const range = d.kind === 'gate' ? (d.op ? (GATE_TERMINALS[d.op] ?? [3, Infinity]) : undefined) : TERMINALS[d.kind];
    if (range && (d.terminals.length < range[0] || d.terminals.length > range[1])) {
      const want = range[0] === range[1] ? `${range[0]}` : range[1] === Infinity ? `at least ${range[0]}` : `${range[0]} or ${range[1]}`;
      ctx.addIssue({ code: 'custom', path: ['terminals'], message: `${d.name} (${d.op ?? d.kind}) needs ${want} terminals, found ${d.terminals.length}` });
    }
  });

export const ModelSchema = z.object({
  name: z.string().min(1),
  type: z.string().min(1),
  params: ParamsSchema.default({}),
  loc: SourceLocSchema.optional(),
});

export const InstanceSchema = z.object({
  name: z.string().min(1),
  cell: z.string().min(1),
  connections: z.array(NetName),
  params: ParamsSchema.default({}),
  loc: SourceLocSchema.optional(),
});

const NetKindSchema = z.enum(['wire', 'tri', 'wand', 'wor', 'supply0', 'supply1']);

export const CellSchema = z.object({
  name: z.string().min(1),
  ports: z.array(NetName),
  directions: z.record(z.string(), z.enum(['input', 'output', 'inout'])).optional(),
  devices: z.array(DeviceSchema),
  instances: z.array(InstanceSchema).default([]),
  netKinds: z.record(z.string(), NetKindSchema).optional(),
  loc: SourceLocSchema.optional(),
});

export const DesignSchema = z.object({
  title: z.string(),
  format: z.enum(['spice', 'verilog', 'json', 'pla']),
  top: z.string().min(1),
  cells: z.record(z.string(), CellSchema),
  models: z.record(z.string(), ModelSchema).default({}),
  globals: z.array(NetName).default([]),
  params: z.record(z.string(), z.number().finite()).default({}),
  extraCards: z.array(z.object({ text: z.string(), loc: SourceLocSchema.optional() })).default([]),
});

export const NetlistJsonSchema = z.object({
  format: z.literal(NETLIST_JSON_FORMAT),
  version: z.literal(NETLIST_JSON_VERSION),
  design: DesignSchema,
});

export type NetlistJson = z.infer<typeof NetlistJsonSchema>;
