import { line, curveBasis } from 'd3-shape';
import { useMemo, useRef, useState } from 'react';
import { PanResponder, Pressable, StyleSheet, View, useWindowDimensions, type LayoutChangeEvent } from 'react-native';
import Svg, { G, Path, Rect, Text as SvgText } from 'react-native-svg';
import { SAMPLE_KIND_LABELS, SAMPLE_STATUS_LABELS } from '@/shared/samples';
import { fontFaces, radii, sizes, space, typeScale, useTheme } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Text } from '@/components/ui/text';
import type { GraphLayout, PlacedEdge, PlacedNode, Point } from './graph-layout';
import { layerCall } from './lineage-words';
import { useWheelZoom } from './use-wheel-zoom';

const MIN_SCALE = 0.2;
const MAX_SCALE = 2.5;
const BUTTON_ZOOM = 1.25;
/** Below this the labels are too small to read, so the first view centres on the record instead (common practice, no source). */
const READABLE_SCALE = 0.6;
/** A drag shorter than this is a tap on a record, not a pan (common practice, no source). */
const DRAG_THRESHOLD_PX = 6;
const ARROW = 7;
/** The picture takes most of a wide window but leaves the heading and buttons in view. */
const MIN_VIEW_HEIGHT = 360;
const MAX_VIEW_HEIGHT = 760;
const CHROME_HEIGHT = 300;

interface View2D {
  scale: number;
  x: number;
  y: number;
}

const clampScale = (scale: number) => Math.min(MAX_SCALE, Math.max(MIN_SCALE, scale));
const clip = (text: string, max: number) => (text.length > max ? `${text.slice(0, max - 1)}…` : text);
const pathOf = line<Point>()
  .x((point) => point.x)
  .y((point) => point.y)
  .curve(curveBasis);

export interface LineageCanvasProps {
  layout: GraphLayout;
  focusCode: string;
  onOpen: (code: string) => void;
}

/**
 * The lineage as a layered picture: drag to move, wheel or buttons to zoom, tap a record to open
 * it. Nodes and links are SVG; each node has a pressable over it so it can be reached by touch,
 * keyboard and screen reader.
 */
export function LineageCanvas({ layout, focusCode, onOpen }: LineageCanvasProps) {
  const { colors } = useTheme();
  const { height: windowHeight } = useWindowDimensions();
  const viewHeight = Math.round(Math.min(MAX_VIEW_HEIGHT, Math.max(MIN_VIEW_HEIGHT, windowHeight - CHROME_HEIGHT)));
  const [viewWidth, setViewWidth] = useState(0);
  const [view, setView] = useState<View2D | null>(null);
  const viewport = useRef<View>(null);
  const dragStart = useRef<View2D | null>(null);
  const viewRef = useRef<View2D | null>(view);
  viewRef.current = view;

  const focus = layout.nodes.find((placed) => placed.node.code === focusCode) ?? null;

  const fitted = (width: number): View2D => {
    const fit = Math.min(1, width / Math.max(1, layout.width), viewHeight / Math.max(1, layout.height));
    if (fit >= READABLE_SCALE || !focus) {
      const scale = clampScale(fit);
      return { scale, x: (width - layout.width * scale) / 2, y: (viewHeight - layout.height * scale) / 2 };
    }
    return centredOn(focus, width, READABLE_SCALE);
  };
  const centredOn = (placed: PlacedNode, width: number, scale: number): View2D => ({
    scale,
    x: width / 2 - (placed.x + placed.width / 2) * scale,
    y: viewHeight / 2 - (placed.y + placed.height / 2) * scale,
  });

  const onLayout = (event: LayoutChangeEvent) => {
    const width = Math.round(event.nativeEvent.layout.width);
    setViewWidth(width);
    setView((current) => current ?? fitted(width));
  };

  /** Zoom by `factor` keeping the point (x, y) of the viewport where it is. */
  const zoomAbout = (factor: number, x: number, y: number) =>
    setView((current) => {
      if (!current) return current;
      const scale = clampScale(current.scale * factor);
      const ratio = scale / current.scale;
      return { scale, x: x - (x - current.x) * ratio, y: y - (y - current.y) * ratio };
    });
  useWheelZoom(viewport, zoomAbout);

  const pan = useMemo(
    () =>
      PanResponder.create({
        onMoveShouldSetPanResponderCapture: (_event, gesture) => Math.hypot(gesture.dx, gesture.dy) > DRAG_THRESHOLD_PX,
        onMoveShouldSetPanResponder: (_event, gesture) => Math.hypot(gesture.dx, gesture.dy) > DRAG_THRESHOLD_PX,
        onPanResponderGrant: () => {
          dragStart.current = viewRef.current;
        },
        onPanResponderMove: (_event, gesture) => {
          const start = dragStart.current;
          if (start) setView({ ...start, x: start.x + gesture.dx, y: start.y + gesture.dy });
        },
        onPanResponderRelease: () => {
          dragStart.current = null;
        },
        onPanResponderTerminationRequest: () => false,
      }),
    [],
  );

  const current = view ?? { scale: 1, x: 0, y: 0 };
  return (
    <View style={styles.stack}>
      <View style={styles.toolbar}>
        <Button
          title="Zoom in"
          icon="add"
          variant="secondary"
          onPress={() => zoomAbout(BUTTON_ZOOM, viewWidth / 2, viewHeight / 2)}
          disabled={current.scale >= MAX_SCALE}
          testID="lineage-zoom-in"
        />
        <Button
          title="Zoom out"
          icon="remove"
          variant="secondary"
          onPress={() => zoomAbout(1 / BUTTON_ZOOM, viewWidth / 2, viewHeight / 2)}
          disabled={current.scale <= MIN_SCALE}
          testID="lineage-zoom-out"
        />
        <Button
          title="Fit"
          icon="scan-outline"
          variant="secondary"
          onPress={() => setView(fitted(viewWidth))}
          testID="lineage-fit"
        />
        {focus ? (
          <Button
            title={`Centre on ${focusCode}`}
            icon="locate-outline"
            variant="quiet"
            onPress={() => setView(centredOn(focus, viewWidth, Math.max(current.scale, READABLE_SCALE)))}
            testID="lineage-centre"
          />
        ) : null}
      </View>
      <View
        ref={viewport}
        onLayout={onLayout}
        style={[styles.viewport, { height: viewHeight, backgroundColor: colors.paper, borderColor: colors.hairline }]}
        testID="lineage-canvas"
        {...pan.panHandlers}
      >
        {view ? (
          <View
            style={[
              styles.plane,
              {
                width: layout.width,
                height: layout.height,
                transform: [{ translateX: view.x }, { translateY: view.y }, { scale: view.scale }],
              },
            ]}
          >
            <Drawing layout={layout} focusCode={focusCode} />
            {layout.nodes.map((placed) => (
              <Pressable
                key={placed.node.code}
                accessibilityRole="link"
                accessibilityLabel={`${placed.node.code}, ${SAMPLE_KIND_LABELS[placed.node.kind]}, ${placed.node.material}${placed.node.code === focusCode ? ', this record' : ''}. Open it.`}
                onPress={() => onOpen(placed.node.code)}
                testID={`lineage-node-${placed.node.code}`}
                style={({ pressed }) => [
                  styles.hit,
                  { left: placed.x, top: placed.y, width: placed.width, height: placed.height },
                  pressed && { backgroundColor: colors.sunken, opacity: 0.35 },
                ]}
              />
            ))}
          </View>
        ) : null}
      </View>
      <Text variant="caption" tone="muted">
        Drag to move the picture; zoom with the buttons or the mouse wheel. Select a record to open it.
      </Text>
    </View>
  );
}

/** The SVG: links first (under), then their step labels, then the record boxes. */
function Drawing({ layout, focusCode }: { layout: GraphLayout; focusCode: string }) {
  const { colors } = useTheme();
  return (
    <Svg width={layout.width} height={layout.height} style={StyleSheet.absoluteFill}>
      {layout.edges.map((edge) => (
        <EdgePath key={edge.key} edge={edge} color={colors.outline} />
      ))}
      {layout.edges.map((edge) => (
        <EdgeLabel key={`label-${edge.key}`} edge={edge} />
      ))}
      {layout.nodes.map((placed) => (
        <NodeBox key={placed.node.code} placed={placed} focused={placed.node.code === focusCode} />
      ))}
    </Svg>
  );
}

function EdgePath({ edge, color }: { edge: PlacedEdge; color: string }) {
  const end = edge.points[edge.points.length - 1];
  const before = edge.points[edge.points.length - 2];
  if (!end || !before) return null;
  // An arrowhead along the last segment, pointing into the child.
  const angle = Math.atan2(end.y - before.y, end.x - before.x);
  const wing = (side: number) => ({
    x: end.x - ARROW * Math.cos(angle + side * 0.45),
    y: end.y - ARROW * Math.sin(angle + side * 0.45),
  });
  const left = wing(1);
  const right = wing(-1);
  return (
    <G>
      <Path d={pathOf(edge.points) ?? ''} fill="none" stroke={color} strokeWidth={1.5} />
      <Path d={`M${end.x},${end.y} L${left.x},${left.y} L${right.x},${right.y} Z`} fill={color} />
    </G>
  );
}

function EdgeLabel({ edge }: { edge: PlacedEdge }) {
  const { colors } = useTheme();
  const font = typeScale.caption.fontSize ?? 14;
  const width = edge.label.length * 7.5 + 12;
  return (
    <G>
      <Rect
        x={edge.labelAt.x - width / 2}
        y={edge.labelAt.y - 10}
        width={width}
        height={20}
        rx={radii.sm}
        fill={colors.paper}
        opacity={0.9}
      />
      <SvgText
        x={edge.labelAt.x}
        y={edge.labelAt.y + font / 3}
        textAnchor="middle"
        fontSize={font - 1}
        fontFamily={fontFaces.sansRegular}
        fill={colors.inkMuted}
      >
        {edge.label}
      </SvgText>
    </G>
  );
}

function NodeBox({ placed, focused }: { placed: PlacedNode; focused: boolean }) {
  const { colors } = useTheme();
  const { node } = placed;
  const layers = layerCall(node);
  const pad = space.md;
  return (
    <G>
      <Rect
        x={placed.x}
        y={placed.y}
        width={placed.width}
        height={placed.height}
        rx={radii.md}
        fill={focused ? colors.primarySoft : colors.surface}
        stroke={focused ? colors.primary : colors.outline}
        strokeWidth={focused ? sizes.focusRing : sizes.hairline}
      />
      <SvgText
        x={placed.x + pad}
        y={placed.y + 22}
        fontSize={typeScale.code.fontSize}
        fontFamily={fontFaces.monoMedium}
        fill={focused ? colors.onPrimarySoft : colors.primary}
      >
        {clip(node.code, 20)}
      </SvgText>
      <SvgText
        x={placed.x + pad}
        y={placed.y + 42}
        fontSize={typeScale.caption.fontSize}
        fontFamily={fontFaces.sansMedium}
        fill={colors.ink}
      >
        {clip(`${SAMPLE_KIND_LABELS[node.kind]} · ${node.material}`, 26)}
      </SvgText>
      <SvgText
        x={placed.x + pad}
        y={placed.y + 61}
        fontSize={typeScale.caption.fontSize}
        fontFamily={fontFaces.sansRegular}
        fill={colors.inkMuted}
      >
        {clip(
          [layers, node.status === 'ready' || node.status === 'in_process' ? null : SAMPLE_STATUS_LABELS[node.status]]
            .filter(Boolean)
            .join(' · ') || ' ',
          28,
        )}
      </SvgText>
    </G>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.md },
  toolbar: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  viewport: {
    overflow: 'hidden',
    borderRadius: radii.lg,
    borderWidth: sizes.hairline,
    position: 'relative',
    // Dragging the picture should not select its text in a browser.
    userSelect: 'none',
  },
  plane: { position: 'absolute', left: 0, top: 0, transformOrigin: 'left top' },
  hit: { position: 'absolute', borderRadius: radii.md },
});
