// Shapes of the trade-off explorer's engine: what a stored design's proposals give it (inputs),
// what the learner moves (settings and the toggled set), and what it recomputes (result).
import type { Savings } from '../cost/cost';
import type { MarginResult, MarginStatus } from '../margins/corners';

/** Part totals of a design or a saving: the cost engine's Savings shape. */
export type PartTotals = Savings;

/** One proposal as the explorer needs it: its part delta and its margins with their inputs. */
export interface WhatIfProposal {
  id: string;
  ruleId: string;
  title: string;
  savings: PartTotals;
  margins: MarginResult[];
  overlapsWith: string[];
}

export interface WhatIfInputs {
  /** The design revision's totals before any proposal. */
  baseline: PartTotals;
  currency: string;
  proposals: WhatIfProposal[];
}

/**
 * The learner's settings. A field left out keeps each margin's stored figure; a field given
 * replaces it in every check that uses it (see recompute.ts for which).
 */
export interface WhatIfSettings {
  /** Minimum current gain β_min of the transistors. */
  betaMin?: number;
  /** Pull-up resistor value, Ω. */
  pullUpOhms?: number;
  /** Nominal supply voltage, V. */
  supplyVolts?: number;
  /** Clock period, s. */
  clockPeriod?: number;
  /** Number of loads on each shared line or driver. */
  loads?: number;
}

export interface RecomputedMargin extends MarginResult {
  /** False when the stored result has no inputs (kept as scanned). */
  recomputed: boolean;
}

export interface ProposalOutcome {
  id: string;
  enabled: boolean;
  margins: RecomputedMargin[];
  status: MarginStatus;
}

export interface WhatIfResult {
  enabled: string[];
  parts: { before: PartTotals; after: PartTotals; saved: PartTotals };
  currency: string;
  proposals: ProposalOutcome[];
  /** Worst status over the enabled proposals' margins (pass when none is enabled). */
  status: MarginStatus;
  counts: Record<MarginStatus, number>;
  /** The slowest pulled-up line among the enabled proposals, or null when none has one. */
  worstRiseTime: { proposalId: string; value: number; limit: number; status: MarginStatus } | null;
  /** Enabled pairs that change the same parts: they cannot both be applied. */
  conflicts: [string, string][];
}
