import Ionicons from '@expo/vector-icons/Ionicons';
import { Link } from 'expo-router';
import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';
import { PLACE_KIND_LABELS, type BoxSummary, type StoragePlace } from '@/shared/schemas/storage';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Screen } from '@/components/ui/screen';
import { EmptyState, ErrorState, LoadingState } from '@/components/ui/state-views';
import { Heading, Text } from '@/components/ui/text';
import { useBreakpoints } from '@/hooks/use-breakpoints';
import { useSessionQuery } from '@/hooks/use-session';
import { useBoxesQuery, usePlacesQuery } from '@/hooks/use-storage';
import { AddBoxCard, AddPlaceCard } from './add-storage-cards';
import { occupancyWords, slotCount } from './location-words';

const TITLE = 'Boxes';
const LEAD = 'Where samples are kept: the lab’s places, the boxes in them and how full each box is.';
/** Each level of the place tree is set in by this much. */
const INDENT = space.lg;

type Adding = 'none' | 'place' | 'box';

export function BoxesScreen() {
  const session = useSessionQuery();
  const places = usePlacesQuery();
  const boxes = useBoxesQuery();
  const [adding, setAdding] = useState<Adding>('none');
  const isManager = session.data?.role === 'manager';

  const actions = isManager ? (
    <>
      <Button title="Add a box" icon="add" onPress={() => setAdding('box')} testID="boxes-add-box" />
      <Button title="Add a place" icon="add" variant="secondary" onPress={() => setAdding('place')} testID="boxes-add-place" />
    </>
  ) : null;

  return (
    <Screen title={TITLE} lead={LEAD} actions={actions} testID="boxes-screen">
      {adding === 'place' ? <AddPlaceCard onClose={() => setAdding('none')} /> : null}
      {adding === 'box' ? <AddBoxCard onClose={() => setAdding('none')} /> : null}
      {!places.data || !boxes.data ? (
        places.isError || boxes.isError ? (
          <ErrorState
            title="Could not load the places and boxes"
            error={places.error ?? boxes.error}
            onRetry={() => {
              void places.refetch();
              void boxes.refetch();
            }}
            retrying={places.isFetching || boxes.isFetching}
          />
        ) : (
          <LoadingState label="Loading places and boxes…" />
        )
      ) : places.data.length === 0 && boxes.data.length === 0 ? (
        <EmptyState
          icon="grid-outline"
          title="No places or boxes yet"
          testID="boxes-empty"
          action={
            isManager && adding === 'none' ? (
              <Button title="Add the first place" icon="add" onPress={() => setAdding('place')} testID="boxes-empty-add" />
            ) : null
          }
        >
          {isManager
            ? 'Start with a room or cabinet, then add the boxes kept there. Each box gets a label to scan.'
            : 'A lab manager sets up the places and boxes; then samples can be put away and found here.'}
        </EmptyState>
      ) : (
        <PlaceTree places={places.data} boxes={boxes.data} />
      )}
    </Screen>
  );
}

/** Places in path order, each with its boxes; boxes with no place come last. */
function PlaceTree({ places, boxes }: { places: StoragePlace[]; boxes: BoxSummary[] }) {
  const loose = boxes.filter((box) => box.placeId === null);
  return (
    <View style={styles.tree} testID="boxes-tree">
      {places.map((place) => {
        const within = place.path.split(' › ').slice(0, -1);
        return (
          <PlaceSection
            key={place.id}
            title={place.name}
            detail={[PLACE_KIND_LABELS[place.kind], within.length ? `in ${within.join(' › ')}` : null]
              .filter(Boolean)
              .join(' · ')}
            depth={within.length}
            boxes={boxes.filter((box) => box.placeId === place.id)}
            testID={`place-${place.id}`}
          />
        );
      })}
      {loose.length ? (
        <PlaceSection
          title="Not in a place"
          detail="Boxes a lab manager has not placed yet"
          depth={0}
          boxes={loose}
          testID="place-none"
        />
      ) : null}
    </View>
  );
}

interface PlaceSectionProps {
  title: string;
  /** Its kind and, for a place inside another, the path above it. */
  detail: string;
  depth: number;
  boxes: BoxSummary[];
  testID: string;
}

function PlaceSection({ title, detail, depth, boxes, testID }: PlaceSectionProps) {
  const { colors } = useTheme();
  return (
    <View style={[styles.place, { marginLeft: depth * INDENT, borderLeftColor: colors.hairline }]} testID={testID}>
      <View style={styles.placeHeading}>
        <Ionicons name="location-outline" size={sizes.iconSmall} color={colors.inkMuted} style={styles.placeIcon} />
        <View style={styles.placeTitle}>
          <Heading level={2}>{title}</Heading>
          <Text variant="caption" tone="muted">
            {detail}
          </Text>
        </View>
      </View>
      {boxes.length ? (
        <View style={styles.boxes} role="list" accessibilityLabel={`Boxes in ${title}`}>
          {boxes.map((box) => (
            <View key={box.code} role="listitem">
              <BoxRow box={box} />
            </View>
          ))}
        </View>
      ) : (
        <Text tone="muted">No boxes here.</Text>
      )}
    </View>
  );
}

function BoxRow({ box }: { box: BoxSummary }) {
  const { colors } = useTheme();
  const { isPhone } = useBreakpoints();
  const share = slotCount(box) ? box.occupied / slotCount(box) : 0;
  return (
    <Link href={{ pathname: '/boxes/[code]', params: { code: box.code } }} asChild>
      <Pressable testID={`box-row-${box.code}`} accessibilityLabel={`${box.name}, ${occupancyWords(box)}`} style={styles.target}>
        {({ pressed }) => (
          <View
            style={[
              styles.row,
              isPhone && styles.rowPhone,
              { backgroundColor: pressed ? colors.sunken : colors.surface, borderColor: colors.hairline },
            ]}
          >
            <Ionicons name="grid-outline" size={sizes.icon} color={colors.primary} />
            <View style={styles.rowText}>
              <Text variant="label" numberOfLines={1}>
                {box.name}
              </Text>
              <Text variant="caption" tone="muted" numberOfLines={1}>
                {`${box.code} · ${box.rows} × ${box.columns}`}
              </Text>
            </View>
            <View style={[styles.fill, isPhone && styles.fillPhone]}>
              <Text variant="caption" tone="muted" style={isPhone ? null : styles.fillText}>
                {occupancyWords(box)}
              </Text>
              <View style={[styles.bar, { backgroundColor: colors.sunken }]}>
                <View style={[styles.barFill, { width: `${Math.round(share * 100)}%`, backgroundColor: colors.primary }]} />
              </View>
            </View>
          </View>
        )}
      </Pressable>
    </Link>
  );
}

const BAR_HEIGHT = space.sm - space.xxs;
const FILL_WIDTH = 128;

const styles = StyleSheet.create({
  tree: { gap: space.xl },
  place: { gap: space.sm, borderLeftWidth: sizes.hairline, paddingLeft: space.md },
  placeHeading: { flexDirection: 'row', alignItems: 'flex-start', gap: space.sm },
  placeIcon: { marginTop: space.xs },
  placeTitle: { flex: 1, minWidth: 0 },
  boxes: { gap: space.xs },
  target: { minHeight: sizes.touchTarget },
  row: {
    minHeight: sizes.touchTarget,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    paddingHorizontal: space.lg,
    paddingVertical: space.sm,
    borderRadius: radii.md,
    borderWidth: sizes.hairline,
  },
  rowPhone: { flexWrap: 'wrap' },
  rowText: { flex: 1, minWidth: 0, gap: space.xxs },
  fill: { width: FILL_WIDTH, gap: space.xs },
  // On phones the gauge takes its own line under the name, so the name is not cut short.
  fillPhone: { width: '100%', paddingLeft: sizes.icon + space.md },
  fillText: { textAlign: 'right' },
  bar: { height: BAR_HEIGHT, borderRadius: radii.pill, overflow: 'hidden' },
  barFill: { height: BAR_HEIGHT, borderRadius: radii.pill },
});
