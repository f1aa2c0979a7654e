import { useRef, useState } from 'react';
import { Image, StyleSheet, useWindowDimensions, View, type GestureResponderEvent } from 'react-native';
import Svg, { Circle, G, Rect, Text as SvgText } from 'react-native-svg';
import type { PixelBox, Region } from '@/shared/schemas/evidence-analysis';
import { fontFaces, radii, space, typeScale, useTheme } from '@/components/theme';
import { Notice } from '@/components/ui/notice';
import { drawingSurfaceStyle } from './drawing-surface-style';
import { boxFromDrag, type Point } from './region-geometry';
import { MARKER_COLOURS } from './plot-colors';
import { useLayoutWidth } from './use-layout-width';

export type MarkTarget = 'flake' | 'substrate';

export interface MarkerCandidate {
  key: string;
  box: PixelBox;
  label: string;
  selected: boolean;
}

export interface MicrographMarkerProps {
  imageUrl: string;
  widthPx: number;
  heightPx: number;
  flakeRegion: Region | null;
  substrateRegion: Region | null;
  /** Which region a drag marks; null when the image is only shown. */
  target: MarkTarget | null;
  onMark: (target: MarkTarget, region: Region) => void;
  candidates?: readonly MarkerCandidate[];
  accessibilityLabel: string;
  testID?: string;
}

/** A drag shorter than this (display pixels) is a stray tap, not a box (common practice, no source). */
const MIN_DRAG_PX = 6;
/** The micrograph never takes more than this share of the window's height, so the controls stay in reach. */
const MAX_HEIGHT_SHARE = 0.7;
const LABEL_FONT = typeScale.caption.fontSize ?? 14;

const REGION_WORDS: Record<MarkTarget, string> = { flake: 'Flake', substrate: 'Substrate' };

/**
 * The micrograph at the width it is given, with the flake and substrate regions drawn over it.
 * Dragging a finger or the mouse across it marks the chosen region as a box; the responder
 * props work for touch on phones and for the mouse in a browser alike.
 */
export function MicrographMarker({
  imageUrl,
  widthPx,
  heightPx,
  flakeRegion,
  substrateRegion,
  target,
  onMark,
  candidates = [],
  accessibilityLabel,
  testID,
}: MicrographMarkerProps) {
  const { colors } = useTheme();
  const window = useWindowDimensions();
  const { width: available, onLayout } = useLayoutWidth();
  const scale = available > 0 ? Math.min(available / widthPx, (window.height * MAX_HEIGHT_SHARE) / heightPx) : 0;
  const shownWidth = Math.round(widthPx * scale);
  const shownHeight = Math.round(heightPx * scale);
  const start = useRef<Point | null>(null);
  const [draft, setDraft] = useState<{ start: Point; end: Point } | null>(null);
  const [unavailable, setUnavailable] = useState(false);

  const at = (event: GestureResponderEvent): Point => ({ x: event.nativeEvent.locationX, y: event.nativeEvent.locationY });
  const finish = (event: GestureResponderEvent) => {
    const from = start.current;
    start.current = null;
    setDraft(null);
    if (!from || !target) return;
    const to = at(event);
    if (Math.abs(to.x - from.x) < MIN_DRAG_PX || Math.abs(to.y - from.y) < MIN_DRAG_PX) return;
    const region = boxFromDrag(from, to, scale, widthPx, heightPx);
    if (region) onMark(target, region);
  };

  const responder =
    target === null
      ? {}
      : {
          onStartShouldSetResponder: () => true,
          onMoveShouldSetResponder: () => true,
          // A scroll view around the page must not take the gesture over half-way through a box.
          onResponderTerminationRequest: () => false,
          onResponderGrant: (event: GestureResponderEvent) => {
            start.current = at(event);
            setDraft({ start: start.current, end: start.current });
          },
          onResponderMove: (event: GestureResponderEvent) => {
            const from = start.current;
            if (from) setDraft({ start: from, end: at(event) });
          },
          onResponderRelease: finish,
          onResponderTerminate: () => {
            start.current = null;
            setDraft(null);
          },
        };

  const draftColour = target ? MARKER_COLOURS[target] : MARKER_COLOURS.flake;

  if (unavailable) {
    return (
      <Notice tone="error" title="The image could not be shown" testID="micrograph-unavailable">
        The server sends a stored file only after checking it against its SHA-256 checksum; this one may be missing or altered, or
        the connection dropped. Reload the page; if it stays like this, tell your lab manager.
      </Notice>
    );
  }

  return (
    <View onLayout={onLayout} style={styles.frame}>
      {scale > 0 ? (
        <View
          style={[
            styles.image,
            { width: shownWidth, height: shownHeight, backgroundColor: colors.sunken },
            target ? drawingSurfaceStyle : null,
          ]}
          accessibilityLabel={accessibilityLabel}
          testID={testID}
          {...responder}
        >
          {/* Nothing under the finger but the surface itself, so touch positions are relative to it. */}
          <View style={styles.passThrough}>
            <Image
              source={{ uri: imageUrl }}
              style={{ width: shownWidth, height: shownHeight }}
              resizeMode="contain"
              accessibilityIgnoresInvertColors
              onError={() => setUnavailable(true)}
            />
            <Svg width={shownWidth} height={shownHeight} style={StyleSheet.absoluteFill}>
              {candidates.map((candidate) => (
                <Outline
                  key={candidate.key}
                  box={scaleBox(candidate.box, scale)}
                  colour={candidate.selected ? MARKER_COLOURS.selectedCandidate : MARKER_COLOURS.candidate}
                  label={candidate.label}
                  thick={candidate.selected}
                />
              ))}
              {substrateRegion ? (
                <RegionShape
                  region={substrateRegion}
                  scale={scale}
                  colour={MARKER_COLOURS.substrate}
                  label={REGION_WORDS.substrate}
                />
              ) : null}
              {flakeRegion ? (
                <RegionShape region={flakeRegion} scale={scale} colour={MARKER_COLOURS.flake} label={REGION_WORDS.flake} />
              ) : null}
              {draft ? (
                <Outline
                  box={{
                    x: Math.min(draft.start.x, draft.end.x),
                    y: Math.min(draft.start.y, draft.end.y),
                    width: Math.abs(draft.end.x - draft.start.x),
                    height: Math.abs(draft.end.y - draft.start.y),
                  }}
                  colour={draftColour}
                  label=""
                  thick
                />
              ) : null}
            </Svg>
          </View>
        </View>
      ) : null}
    </View>
  );
}

function scaleBox(box: PixelBox, scale: number): PixelBox {
  return { x: box.x * scale, y: box.y * scale, width: box.width * scale, height: box.height * scale };
}

function RegionShape({ region, scale, colour, label }: { region: Region; scale: number; colour: string; label: string }) {
  if (region.shape === 'box') return <Outline box={scaleBox(region, scale)} colour={colour} label={label} thick />;
  return (
    <G>
      {region.points.map((point, i) => (
        <G key={`${point.x},${point.y},${i}`}>
          <Circle
            cx={point.x * scale}
            cy={point.y * scale}
            r={Math.max(3, region.radiusPx * scale)}
            stroke={MARKER_COLOURS.halo}
            strokeWidth={5}
            fill="none"
          />
          <Circle
            cx={point.x * scale}
            cy={point.y * scale}
            r={Math.max(3, region.radiusPx * scale)}
            stroke={colour}
            strokeWidth={2.5}
            fill="none"
          />
        </G>
      ))}
      {region.points[0] ? (
        <Tag x={region.points[0].x * scale} y={region.points[0].y * scale} colour={colour} label={label} />
      ) : null}
    </G>
  );
}

/** A box with a dark halo under the coloured line, so it reads on a bright or a dark part of the photo. */
function Outline({ box, colour, label, thick }: { box: PixelBox; colour: string; label: string; thick: boolean }) {
  const stroke = thick ? 3 : 2;
  return (
    <G>
      <Rect
        x={box.x}
        y={box.y}
        width={box.width}
        height={box.height}
        stroke={MARKER_COLOURS.halo}
        strokeWidth={stroke + 2.5}
        fill="none"
      />
      <Rect x={box.x} y={box.y} width={box.width} height={box.height} stroke={colour} strokeWidth={stroke} fill="none" />
      {label ? <Tag x={box.x} y={box.y} colour={colour} label={label} /> : null}
    </G>
  );
}

function Tag({ x, y, colour, label }: { x: number; y: number; colour: string; label: string }) {
  const width = label.length * LABEL_FONT * 0.62 + space.sm;
  const height = LABEL_FONT + space.xs;
  // Above the box when there is room, inside its top edge otherwise.
  const top = y - height >= 0 ? y - height : y;
  return (
    <G>
      <Rect x={x} y={top} width={width} height={height} fill={MARKER_COLOURS.halo} rx={radii.sm / 2} />
      <SvgText x={x + space.xs} y={top + LABEL_FONT - 1} fill={colour} fontSize={LABEL_FONT} fontFamily={fontFaces.sansMedium}>
        {label}
      </SvgText>
    </G>
  );
}

const styles = StyleSheet.create({
  frame: { alignSelf: 'stretch', alignItems: 'center' },
  image: { overflow: 'hidden', borderRadius: radii.sm },
  passThrough: { position: 'absolute', top: 0, left: 0, right: 0, bottom: 0, pointerEvents: 'none' },
});
