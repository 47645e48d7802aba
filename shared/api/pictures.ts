// Pictures of a proposal: the region it changes (before/after graphs to draw) and a before/after
// switch-level simulation of that region with a default or edited stimulus.
import { z } from 'zod';

const LevelSchema = z.union([z.literal(0), z.literal(1), z.literal('X'), z.literal('Z')]);
const PartSchema = z.object({
  name: z.string(),
  kind: z.enum(['npn', 'pnp', 'nmos', 'pmos', 'resistor', 'capacitor', 'diode', 'vsource', 'isource', 'gate']),
  op: z.enum(['buf', 'not', 'and', 'or', 'nand', 'nor', 'xor', 'xnor', 'bufif0', 'bufif1', 'notif0', 'notif1', 'pullup', 'pulldown', 'latch', 'dff']).optional(),
  value: z.number().optional(),
  model: z.string().optional(),
  terminals: z.array(z.object({ name: z.string(), net: z.string() })),
  role: z.enum(['removed', 'added', 'changed', 'neighbour', 'plain']),
});
const NetSchema = z.object({ name: z.string(), railVolts: z.number().optional(), boundary: z.boolean() });
export const RegionGraphSchema = z.object({ parts: z.array(PartSchema), nets: z.array(NetSchema) });

export const ProposalRegionSchema = z.object({
  proposalId: z.uuid(),
  ruleId: z.string(),
  before: RegionGraphSchema,
  after: RegionGraphSchema,
  removed: z.array(z.string()),
  added: z.array(z.string()),
  reconnected: z.array(z.string()),
  ringTruncated: z.number().int(),
  /** Inputs the region's nets depend on (the default stimulus sets them). */
  inputs: z.array(z.string()),
  /** The default stimulus in its text form (one step a line, `NAME=0 NAME=1`; `clock NAME` first when clocked). */
  stimulus: z.string(),
  assumptions: z.array(z.object({ id: z.uuid(), expression: z.string() })),
});
export type ProposalRegion = z.infer<typeof ProposalRegionSchema>;

export const MAX_STIMULUS_CHARS = 20_000;
export const SimulateBodySchema = z.strictObject({ stimulus: z.string().max(MAX_STIMULUS_CHARS).optional() });
export type SimulateBody = z.infer<typeof SimulateBodySchema>;

export const RegionSimulationSchema = z.object({
  steps: z.number().int(),
  stimulus: z.string(),
  applied: z.array(z.record(z.string(), z.union([z.literal(0), z.literal(1), z.literal('X')]))),
  lanes: z.array(z.object({ net: z.string(), role: z.enum(['input', 'net']), before: z.array(LevelSchema).optional(), after: z.array(LevelSchema).optional(), firstDifference: z.number().int().optional() })),
  firstDifference: z.object({ step: z.number().int(), nets: z.array(z.string()) }).optional(),
  contention: z.array(z.object({ side: z.enum(['before', 'after']), net: z.string(), step: z.number().int() })),
  floating: z.array(z.object({ side: z.enum(['before', 'after']), net: z.string(), step: z.number().int() })),
});
export type RegionSimulation = z.infer<typeof RegionSimulationSchema>;

export const DrawingQuerySchema = z.strictObject({
  revision: z.coerce.number().int().min(1).optional(),
  /** Instance path of one subcircuit ("XSLICE3" or "XSLICE3.XEN"); the whole design when absent. */
  instance: z.string().min(1).max(200).optional(),
});
export const DesignDrawingSchema = z.object({ revision: z.number().int(), instance: z.string().nullable(), graph: RegionGraphSchema });
export type DesignDrawing = z.infer<typeof DesignDrawingSchema>;
