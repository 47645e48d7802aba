// Shapes shared by rules, the scan and the rewriter: assumptions, edits (a proposal is data,
// never a mutation), findings, and the context a rule's find() receives.
import type { z } from 'zod';
import type { LogicView } from '../extract/types';
import type { Expr } from '../logic/expr';
import type { Minimiser } from '../logic/minimiser';
import type { MapFamily } from '../logic/family-parts';
import type { MarginResult } from '../margins/corners';
import type { MarginSettings } from '../margins/defaults';
import type { DeviceKind, FlatNetlist, GateOp, Model, ParamValue } from '../netlist/ir';

/** A stated operating assumption: an expression over net names with a stable id. */
export interface Assumption {
  id: string;
  text: string;
  expr: Expr;
}

/** A device a proposal adds; terminals are net names (new names create nets). */
export interface AddedDevice {
  name: string;
  kind: DeviceKind;
  op?: GateOp;
  terminals: string[];
  value?: number;
  model?: string;
  params?: Record<string, ParamValue>;
  /** Instance path to record for the new device (where it is drawn); default top level. */
  path?: string[];
}

/**
 * A rewrite as data. Applied in this order: merge nets, remove devices, reconnect terminals,
 * add devices. Device and net names are the FlatNetlist's hierarchical names.
 */
export interface Edit {
  removeDevices: string[];
  addDevices: AddedDevice[];
  /** Move one terminal (index per TERMINAL_NAMES order) of a kept device onto another net. */
  reconnect: { device: string; terminal: number; net: string }[];
  /** Join net `remove` into net `keep` (every terminal on `remove` moves to `keep`). */
  mergeNets: { keep: string; remove: string }[];
  /** Model cards the added devices need that the design lacks (a name already present is kept as is). */
  addModels?: Model[];
}

export const emptyEdit = (): Edit => ({ removeDevices: [], addDevices: [], reconnect: [], mergeNets: [] });

export interface Proposal {
  /** Stable id (rule + location hash), the same for the same design and assumptions. */
  id: string;
  title: string;
  edit: Edit;
  /** Ids of the assumptions this rewrite is only valid under. */
  assumptions: string[];
  /** Electrical checks the rule evaluated for this rewrite (worst corner each). */
  margins: MarginResult[];
}

export interface FindingLocation {
  devices: string[];
  /** Instance paths involved ("XSLICE3"), for "bit 3 of slice X" wording. */
  instances: string[];
  nets: string[];
}

export interface Finding {
  /** Stable id: the rule's id and a hash of what and where, the same for the same design. */
  id: string;
  ruleId: string;
  messageId: string;
  data: Record<string, string | number>;
  /** The message template with its placeholders filled. */
  message: string;
  location: FindingLocation;
  proposals: Proposal[];
}

/** What a rule reports; ids are assigned by the engine. */
export interface FindingReport {
  messageId: string;
  data?: Record<string, string | number>;
  location: Partial<FindingLocation>;
  proposals: { title: string; edit: Edit; assumptions?: string[]; margins?: MarginResult[] }[];
}

export interface RuleContext {
  readonly netlist: Readonly<FlatNetlist>;
  readonly view: Readonly<LogicView>;
  readonly assumptions: readonly Assumption[];
  readonly margins: MarginSettings;
  readonly minimiser: Minimiser;
  /** Family gate-level designs are mapped to for counting (static CMOS unless stated). */
  readonly targetFamily: MapFamily;
  /** Clock period in seconds, when the design or board gives one. */
  readonly clockPeriod?: number;
  report(finding: FindingReport): void;
  /** Records a problem with one element (recorded as a rule error) and lets the rule go on. */
  reportError(element: string, message: string): void;
}

export interface RuleMeta<S extends z.ZodType> {
  description: string;
  /** Message id → template with {placeholders}. */
  messages: Record<string, string>;
  optionsSchema: S;
  defaultOptions: z.infer<S>;
}

export interface Rule<S extends z.ZodType = z.ZodType> {
  id: string;
  meta: RuleMeta<S>;
  find(ctx: RuleContext, options: z.infer<S>): void | Promise<void>;
}
