// Lays a graph out in the browser (or on the device) and keeps the result; a new graph starts over.
import { useEffect, useState } from 'react';
import type { RegionGraph } from '@/optimizer/region/graph';
import { layoutRegion, type Drawing } from './layout';

export type DrawingState = { drawing?: Drawing; error?: Error; ms?: number };

export function useDrawing(graph: RegionGraph | undefined): DrawingState {
  const [state, setState] = useState<DrawingState>({});
  useEffect(() => {
    if (!graph) return;
    let live = true;
    const t0 = Date.now();
    setState({});
    layoutRegion(graph).then(
      (drawing) => live && setState({ drawing, ms: Date.now() - t0 }),
      (error: unknown) => live && setState({ error: error instanceof Error ? error : new Error(String(error)) }),
    );
    return () => {
      live = false;
    };
  }, [graph]);
  return state;
}
