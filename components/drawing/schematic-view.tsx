// One drawing with its toolbar (zoom in, zoom out, fit), pan and zoom, a summary for screen readers
// and a table of parts and nets on request. Lays the graph out on this device with elkjs.
import { useCallback, useEffect, useRef, useState } from 'react';
import { View, type LayoutChangeEvent } from 'react-native';
import Svg from 'react-native-svg';
import { Button, ErrorState, Loading, Text } from '@/components/ui';
import { useTheme } from '@/components/theme/use-theme';
import type { RegionGraph } from '@/optimizer/region/graph';
import { graphSummary, PartsTable } from './parts-table';
import { SchematicContent } from './schematic-svg';
import { useDrawing } from './use-drawing';
import { usePointerGestures } from './use-pointer-gestures';
import { fitBox, panBy, viewBoxString, zoomBy, ZOOM_STEP, type ViewBox } from './view-box';

export function SchematicView({ graph, title, testID }: { graph: RegionGraph; title: string; testID: string }) {
  const { colours, spacing, sizes, radii } = useTheme();
  const { drawing, error } = useDrawing(graph);
  const [view, setView] = useState<ViewBox | null>(null);
  const [table, setTable] = useState(false);
  const [box, setBox] = useState<{ w: number; h: number }>({ w: sizes.content, h: sizes.listPane });
  const surface = useRef<View>(null);
  useEffect(() => {
    if (drawing) setView(fitBox(drawing.width, drawing.height));
  }, [drawing]);
  const whole = drawing ? fitBox(drawing.width, drawing.height) : undefined;
  const zoom = useCallback((f: number, fx = 0.5, fy = 0.5) => setView((v) => (v ? zoomBy(v, f, fx, fy, whole) : v)), [whole]);
  const pan = useCallback((dx: number, dy: number) => setView((v) => (v ? panBy(v, dx, dy, box.w, box.h) : v)), [box]);
  usePointerGestures(surface, { zoom, pan });
  const summary = graphSummary(title, graph);
  const height = drawing ? Math.min(sizes.listPane, Math.max(sizes.control * 4, drawing.height)) : sizes.listPane;
  return (
    <View testID={testID} style={{ gap: spacing.sm, flex: 1, minWidth: 0 }}>
      <View style={{ flexDirection: 'row', alignItems: 'center', gap: spacing.xs, flexWrap: 'wrap' }}>
        <Text variant="bodyStrong" style={{ flexGrow: 1 }}>{title}</Text>
        <Button compact variant="secondary" label="+" testID={`${testID}-zoom-in`} accessibilityLabel={`Zoom in on ${title}`} onPress={() => zoom(ZOOM_STEP)} />
        <Button compact variant="secondary" label="−" testID={`${testID}-zoom-out`} accessibilityLabel={`Zoom out of ${title}`} onPress={() => zoom(1 / ZOOM_STEP)} />
        <Button compact variant="secondary" label="Fit" testID={`${testID}-fit`} accessibilityLabel={`Fit ${title} to the frame`} onPress={() => whole && setView(whole)} />
      </View>
      <View
        ref={surface}
        accessible
        accessibilityRole="image"
        accessibilityLabel={summary}
        onLayout={(e: LayoutChangeEvent) => setBox({ w: e.nativeEvent.layout.width, h: e.nativeEvent.layout.height })}
        style={{ height, borderWidth: sizes.hairline, borderColor: colours.border, borderRadius: radii.md, backgroundColor: colours.surface, overflow: 'hidden' }}
      >
        {error ? (
          <ErrorState error={error} testID={`${testID}-error`} />
        ) : !drawing || !view ? (
          <Loading label="Laying out the drawing" testID={`${testID}-loading`} />
        ) : (
          <Svg width="100%" height="100%" viewBox={viewBoxString(view)} preserveAspectRatio="xMidYMid meet" testID={`${testID}-svg`}>
            <SchematicContent drawing={drawing} />
          </Svg>
        )}
      </View>
      <Button
        compact
        variant="ghost"
        label={table ? 'Hide the parts table' : 'Show as a table'}
        testID={`${testID}-table-toggle`}
        accessibilityLabel={`${table ? 'Hide' : 'Show'} ${title} as a table of parts and nets`}
        onPress={() => setTable((t) => !t)}
      />
      {table ? <PartsTable graph={graph} title={title} testID={`${testID}-table`} /> : null}
    </View>
  );
}
