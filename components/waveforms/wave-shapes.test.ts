// Proves the waveform pieces: 0 and 1 become one trace with vertical edges, Z a dashed mid-level run,
// X a band, and runs of equal steps merge.
import { describe, expect, it } from 'vitest';
import { runsOf, waveShapes } from './wave-shapes';

describe('waveShapes', () => {
  it('draws 0→1→0 as one trace with two edges', () => {
    const s = waveShapes([0, 1, 1, 0], 10, 0, 20);
    expect(s.logic).toEqual([[{ x: 0, y: 20 }, { x: 10, y: 20 }, { x: 10, y: 0 }, { x: 30, y: 0 }, { x: 30, y: 20 }, { x: 40, y: 20 }]]);
    expect(s.z).toEqual([]);
    expect(s.x).toEqual([]);
  });

  it('breaks the trace for Z (mid level) and X (a band)', () => {
    const s = waveShapes([1, 'Z', 'Z', 'X', 0], 10, 5, 20);
    expect(s.logic).toEqual([[{ x: 0, y: 5 }, { x: 10, y: 5 }], [{ x: 40, y: 25 }, { x: 50, y: 25 }]]);
    expect(s.z).toEqual([{ x1: 10, x2: 30, y: 15 }]);
    expect(s.x).toEqual([{ x1: 30, x2: 40, top: 5, bottom: 25 }]);
  });

  it('merges equal steps into runs', () => {
    expect(runsOf([0, 0, 'X', 'X', 'X', 1])).toEqual([
      { level: 0, from: 0, to: 2 },
      { level: 'X', from: 2, to: 5 },
      { level: 1, from: 5, to: 6 },
    ]);
  });
});
