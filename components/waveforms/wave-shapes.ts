// Turns one lane of levels into drawable pieces: solid lines for 0 and 1 (with edges between them),
// dashed mid-level runs for Z, hatched bands for X. Pure, so the drawing can be checked in tests.
import type { Level } from '@/optimizer/verify/switch-sim';

export interface WaveShapes {
  /** Polyline points of the 0/1 trace, one list per unbroken run. */
  logic: { x: number; y: number }[][];
  /** Mid-level dashed runs (high impedance). */
  z: { x1: number; x2: number; y: number }[];
  /** Unknown value bands (drawn hatched in the danger colour). */
  x: { x1: number; x2: number; top: number; bottom: number }[];
}

/** Merges equal neighbouring steps into runs [level, from, to). */
export function runsOf(levels: readonly Level[]): { level: Level; from: number; to: number }[] {
  const out: { level: Level; from: number; to: number }[] = [];
  levels.forEach((l, i) => {
    const last = out[out.length - 1];
    if (last && last.level === l) last.to = i + 1;
    else out.push({ level: l, from: i, to: i + 1 });
  });
  return out;
}

export function waveShapes(levels: readonly Level[], stepWidth: number, top: number, height: number): WaveShapes {
  const high = top;
  const low = top + height;
  const mid = top + height / 2;
  const shapes: WaveShapes = { logic: [], z: [], x: [] };
  let current: { x: number; y: number }[] | null = null;
  for (const r of runsOf(levels)) {
    const x1 = r.from * stepWidth;
    const x2 = r.to * stepWidth;
    if (r.level === 0 || r.level === 1) {
      const y = r.level === 1 ? high : low;
      if (current) current.push({ x: x1, y }); // vertical edge from the previous logic run
      else current = [{ x: x1, y }];
      current.push({ x: x2, y });
      continue;
    }
    if (current) shapes.logic.push(current);
    current = null;
    if (r.level === 'Z') shapes.z.push({ x1, x2, y: mid });
    else shapes.x.push({ x1, x2, top: high, bottom: low });
  }
  if (current) shapes.logic.push(current);
  return shapes;
}

export const levelText = (l: Level | undefined) => (l === undefined ? '·' : String(l));
