// What the server sends the trade-off explorer (for a lesson, a share link or a design): the
// what-if inputs, the revision's summary, each proposal's read-only evidence and, for two-level
// rewrites, the side-by-side view. The browser runs runWhatIf on `inputs` with no round trip.
import type { MarginStatus } from '../margins/corners';
import type { ExplorerDefaults } from './settings';
import type { TwoLevelView } from './two-level';
import type { WhatIfInputs } from './types';

/** One device of a changed region, terminals as net names (enough to draw it). */
export interface RegionDevice {
  name: string;
  kind: string;
  op?: string;
  terminals: string[];
  value?: number;
}

/** The region a rewrite changes: the devices it removes, the ones it adds and the moves. */
export interface ChangedRegion {
  before: RegionDevice[];
  after: RegionDevice[];
  reconnect: { device: string; terminal: number; net: string }[];
  mergeNets: { keep: string; remove: string }[];
}

export interface ExplorerProposal {
  id: string;
  ruleId: string;
  title: string;
  message: string;
  verdict: 'proved' | 'refuted' | 'unverified';
  marginStatus: MarginStatus;
  status: string;
  evidence: {
    method: string;
    assumptions: { id: string; expression: string }[];
    counterexample?: Record<string, 0 | 1>;
    differing?: { name: string; before: 0 | 1; after: 0 | 1 }[];
    note?: string;
  };
  location: { devices: string[]; instances: string[]; nets: string[] };
  region: ChangedRegion;
  twoLevel: TwoLevelView | null;
}

export interface ExplorerData {
  design: {
    name: string;
    family: string;
    revision: number;
    title: string;
    devices: number;
    nets: number;
    clockPeriodNs: number | null;
  };
  inputs: WhatIfInputs;
  proposals: ExplorerProposal[];
  defaults: ExplorerDefaults;
  /** The parts table's own note (the demo prices are invented). */
  pricesNote: string;
  cautions: string[];
}
