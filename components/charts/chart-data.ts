// The numbers behind the charts, kept apart from drawing so they can be checked: scales (d3-scale),
// savings summed by rule, each margin's place against its limit, and the revisions' totals line.
import { scaleBand, scaleLinear } from 'd3-scale';
import { line } from 'd3-shape';

/** A linear scale from 0 to a "nice" maximum covering every value (and at least 1). */
export function valueScale(values: readonly number[], width: number) {
  const max = Math.max(1, ...values.filter((v) => Number.isFinite(v)));
  return scaleLinear().domain([0, max]).nice().range([0, width]);
}

export function bandScale(keys: readonly string[], height: number) {
  return scaleBand<string>().domain([...keys]).range([0, height]).paddingInner(0.3).paddingOuter(0.15);
}

export interface RuleSavings { ruleId: string; accepted: number; open: number }

/** Parts saved per rule: accepted (or applied) proposals, and open ones still to decide. */
export function savingsByRule(proposals: readonly { ruleId: string; status: string; savings: { parts: number } }[]): RuleSavings[] {
  const by = new Map<string, RuleSavings>();
  for (const p of proposals) {
    const r = by.get(p.ruleId) ?? { ruleId: p.ruleId, accepted: 0, open: 0 };
    if (p.status === 'accepted' || p.status === 'applied') r.accepted += p.savings.parts;
    else if (p.status === 'open') r.open += p.savings.parts;
    by.set(p.ruleId, r);
  }
  return [...by.values()].sort((a, b) => b.accepted + b.open - (a.accepted + a.open) || a.ruleId.localeCompare(b.ruleId));
}

/**
 * Where a margin sits against its limit, as a fraction of the axis: the axis runs 0..2×limit so
 * the limit is always at the middle; values beyond are clamped and flagged.
 */
export function marginPlace(value: number, limit: number): { at: number; clamped: boolean } {
  if (!Number.isFinite(value) || !Number.isFinite(limit) || limit === 0) return { at: 0.5, clamped: true };
  const f = value / (2 * limit);
  return { at: Math.min(1, Math.max(0, f)), clamped: f < 0 || f > 1 };
}

/** The line of part totals across revisions, as an SVG path and its points. */
export function totalsLine(revisions: readonly { number: number; total: number }[], width: number, height: number) {
  const xs = scaleLinear()
    .domain([Math.min(...revisions.map((r) => r.number)), Math.max(...revisions.map((r) => r.number), revisions[0]?.number + 1 || 2)])
    .range([0, width]);
  const ys = valueScale(revisions.map((r) => r.total), height);
  const points = revisions.map((r) => ({ x: xs(r.number), y: height - ys(r.total), number: r.number, total: r.total }));
  const path = line<{ x: number; y: number }>().x((p) => p.x).y((p) => p.y)(points) ?? '';
  return { path, points, max: ys.domain()[1] };
}
