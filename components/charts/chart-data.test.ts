// Proves the chart numbers: nice value scales, savings summed by rule and status, a margin's place
// with the limit always at the middle of its axis, and the totals line through every revision.
import { describe, expect, it } from 'vitest';
import { marginPlace, savingsByRule, totalsLine, valueScale } from './chart-data';

describe('chart data', () => {
  it('scales from zero to a nice maximum', () => {
    const s = valueScale([13, 87, 40], 200);
    expect(s.domain()).toEqual([0, 90]);
    expect(s(45)).toBe(100);
    expect(valueScale([], 100).domain()).toEqual([0, 1]);
  });

  it('sums savings by rule, accepted apart from open, largest first', () => {
    const p = (ruleId: string, status: string, parts: number) => ({ ruleId, status, savings: { parts } });
    expect(savingsByRule([p('double-inversion', 'accepted', 4), p('double-inversion', 'open', 2), p('tristate-slim', 'applied', 9), p('tristate-slim', 'rejected', 50)])).toEqual([
      { ruleId: 'tristate-slim', accepted: 9, open: 0 },
      { ruleId: 'double-inversion', accepted: 4, open: 2 },
    ]);
  });

  it('puts the limit in the middle and clamps values off the axis', () => {
    expect(marginPlace(1, 1)).toEqual({ at: 0.5, clamped: false });
    expect(marginPlace(0.5, 2)).toEqual({ at: 0.125, clamped: false });
    expect(marginPlace(9, 2)).toEqual({ at: 1, clamped: true });
    expect(marginPlace(-1, 2)).toEqual({ at: 0, clamped: true });
  });

  it('draws the totals line through every revision, higher totals higher up', () => {
    const t = totalsLine([{ number: 1, total: 100 }, { number: 2, total: 80 }, { number: 3, total: 60 }], 200, 100);
    expect(t.points.map((p) => p.x)).toEqual([0, 100, 200]);
    expect(t.points[0].y).toBe(0);
    expect(t.points[2].y).toBe(40);
    expect(t.path).toBe('M0,0L100,20L200,40');
  });
});
