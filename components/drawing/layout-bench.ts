// Layout speed of region drawings (not a test): prints parts, nets, wall and CPU milliseconds per
// size. Run: npx tsx components/drawing/layout-bench.ts
import { designGraph } from '@/optimizer/region/graph';
import { sliceInverters } from '@/optimizer/rules/test-helpers';
import { layoutRegion } from './layout';

async function main() {
  await layoutRegion(designGraph(sliceInverters(4))); // warm the layout engine's code
  const rows: string[][] = [['parts', 'nets', 'wall ms', 'cpu ms']];
  for (const slices of [4, 20, 50, 100, 150]) {
    const g = designGraph(sliceInverters(slices));
    const c = process.cpuUsage();
    const t = performance.now();
    await layoutRegion(g);
    const u = process.cpuUsage(c);
    rows.push([String(g.parts.length), String(g.nets.length), (performance.now() - t).toFixed(0), ((u.user + u.system) / 1000).toFixed(0)]);
  }
  for (const r of rows) console.log(r.map((x) => x.padStart(8)).join(' '));
}

void main();
