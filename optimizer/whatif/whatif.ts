// The trade-off explorer's engine: with a set of proposals toggled on and the learner's settings,
// recompute part counts, cost, area, every margin and the worst rise time. Pure and synchronous
// (no I/O, no Node modules) so the browser and the server run the very same code.
import { InputError } from '../errors';
import type { MarginStatus } from '../margins/corners';
import { DEFAULT_MARGIN_SETTINGS, type MarginSettings } from '../margins/defaults';
import { recomputeMargin } from './recompute';
import type { PartTotals, ProposalOutcome, WhatIfInputs, WhatIfResult, WhatIfSettings } from './types';

const RANK: Record<MarginStatus, number> = { pass: 0, warn: 1, fail: 2 };
const FIELDS = ['transistors', 'resistors', 'diodes', 'capacitors', 'gates', 'areaMm2', 'cost'] as const;

/** Money and area kept to micro-units so sums do not drift in the last digit. */
const tidy = (x: number) => Math.round(x * 1e6) / 1e6;

function combine(a: PartTotals, b: PartTotals, sign: 1 | -1): PartTotals {
  const out = {} as PartTotals;
  for (const f of FIELDS) out[f] = tidy(a[f] + sign * b[f]);
  return out;
}

const ZERO: PartTotals = { transistors: 0, resistors: 0, diodes: 0, capacitors: 0, gates: 0, areaMm2: 0, cost: 0 };

/** Refuses settings no circuit has (zero, negative, not a number): a clear error, not NaN margins. */
export function checkSettings(w: WhatIfSettings): void {
  for (const [key, value] of Object.entries(w)) {
    if (value === undefined) continue;
    if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0) {
      throw InputError.at('whatif.bad-setting', `setting ${key} must be a positive number, got ${String(value)}`);
    }
    if (key === 'loads' && !Number.isInteger(value)) throw InputError.at('whatif.bad-setting', `setting loads must be a whole number, got ${value}`);
  }
}

export function worstStatus(list: { status: MarginStatus }[]): MarginStatus {
  return list.reduce<MarginStatus>((w, m) => (RANK[m.status] > RANK[w] ? m.status : w), 'pass');
}

/**
 * Runs the explorer for one toggled set. Unknown ids in `enabled` are refused (a stale client);
 * the stored inputs are never changed.
 */
export function runWhatIf(
  inputs: WhatIfInputs,
  settings: WhatIfSettings,
  enabled: readonly string[],
  margins: MarginSettings = DEFAULT_MARGIN_SETTINGS,
): WhatIfResult {
  checkSettings(settings);
  const known = new Set(inputs.proposals.map((p) => p.id));
  const unknown = enabled.filter((id) => !known.has(id));
  if (unknown.length) throw InputError.at('whatif.unknown-proposal', `no proposal ${unknown.join(', ')} in this explorer`);
  const on = new Set(enabled);

  const outcomes: ProposalOutcome[] = inputs.proposals.map((p) => {
    const ms = p.margins.map((m) => recomputeMargin(m, settings, margins));
    return { id: p.id, enabled: on.has(p.id), margins: ms, status: worstStatus(ms) };
  });
  const active = outcomes.filter((o) => o.enabled);
  const saved = inputs.proposals.filter((p) => on.has(p.id)).reduce((sum, p) => combine(sum, p.savings, 1), ZERO);

  const counts: Record<MarginStatus, number> = { pass: 0, warn: 0, fail: 0 };
  let worstRiseTime: WhatIfResult['worstRiseTime'] = null;
  for (const o of active) {
    for (const m of o.margins) {
      counts[m.status]++;
      if (m.name === 'rise time' && (!worstRiseTime || m.value > worstRiseTime.value)) {
        worstRiseTime = { proposalId: o.id, value: m.value, limit: m.limit, status: m.status };
      }
    }
  }

  const conflicts: [string, string][] = [];
  for (const p of inputs.proposals) {
    if (!on.has(p.id)) continue;
    for (const q of p.overlapsWith) if (on.has(q) && p.id < q) conflicts.push([p.id, q]);
  }

  return {
    enabled: inputs.proposals.filter((p) => on.has(p.id)).map((p) => p.id),
    parts: { before: { ...inputs.baseline }, after: combine(inputs.baseline, saved, -1), saved },
    currency: inputs.currency,
    proposals: outcomes,
    status: worstStatus(active.flatMap((o) => o.margins)),
    counts,
    worstRiseTime,
    conflicts,
  };
}
