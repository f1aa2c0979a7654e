import { Link } from 'expo-router';
import { useState } from 'react';
import { ActivityIndicator, Pressable, StyleSheet, View } from 'react-native';
import { SAMPLE_KIND_LABELS } from '@/shared/samples';
import type { SampleListRow } from '@/shared/schemas/sample';
import type { Box } from '@/shared/schemas/storage';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { SampleChip } from '@/components/samples/sample-chip';
import { readCode } from '@/components/scan/read-code';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { FormProblem } from '@/components/ui/form-problem';
import { Text } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { useDebouncedValue } from '@/components/ui/use-debounced-value';
import { describeError } from '@/hooks/api-client';
import { SEARCH_MIN_LENGTH, useSampleSearchQuery } from '@/hooks/use-samples';
import { useMoveSampleMutation } from '@/hooks/use-storage';
import type { BoxSlot } from './box-grid';
import { locationWords } from './location-words';
import { MoveSamplePanel } from './move-sample-panel';
import { TakeOutConfirm } from './take-out-confirm';

export interface SlotPanelProps {
  box: Box;
  slot: BoxSlot | null;
  canWrite: boolean;
  onClose: () => void;
}

/** What the chosen slot holds, and what can be done with it. */
export function SlotPanel({ box, slot, canWrite, onClose }: SlotPanelProps) {
  if (!slot) {
    return (
      <Card title="Slots" testID="slot-panel-hint">
        <Text tone="muted">
          {canWrite
            ? 'Tap a slot to see what is in it, or a free one to put a sample there.'
            : 'Tap a slot to see what is in it.'}
        </Text>
        <Legend />
      </Card>
    );
  }
  // A new slot starts with its panel closed.
  return slot.sample ? (
    <OccupiedSlot key={slot.slot} box={box} slot={slot} canWrite={canWrite} />
  ) : (
    <FreeSlot key={slot.slot} box={box} slot={slot} canWrite={canWrite} onClose={onClose} />
  );
}

function Legend() {
  const { colors } = useTheme();
  return (
    <View style={styles.legend}>
      <View style={styles.legendItem}>
        <View style={[styles.swatch, { backgroundColor: colors.primarySoft, borderColor: colors.primarySoft }]} />
        <Text variant="caption" tone="muted">
          Holds a sample
        </Text>
      </View>
      <View style={styles.legendItem}>
        <View style={[styles.swatch, styles.free, { backgroundColor: colors.surface, borderColor: colors.outline }]} />
        <Text variant="caption" tone="muted">
          Free
        </Text>
      </View>
    </View>
  );
}

type OccupiedPanel = 'none' | 'move' | 'take-out';

function OccupiedSlot({ box, slot, canWrite }: { box: Box; slot: BoxSlot; canWrite: boolean }) {
  const [panel, setPanel] = useState<OccupiedPanel>('none');
  const sample = slot.sample;
  if (!sample) return null;
  const location = { boxCode: box.code, boxName: box.name, slot: slot.slot, placePath: box.placePath };
  const active = sample.status === 'ready' || sample.status === 'in_process';
  return (
    <Card title={`Slot ${slot.slot}`} testID="slot-panel">
      <SampleChip sample={sample} note={active ? undefined : 'not in use'} />
      {canWrite && panel === 'none' ? (
        <View style={styles.actions}>
          <Button title="Move" icon="enter-outline" variant="secondary" onPress={() => setPanel('move')} testID="slot-move" />
          <Button
            title="Take out"
            icon="exit-outline"
            variant="quiet"
            onPress={() => setPanel('take-out')}
            testID="slot-take-out"
          />
        </View>
      ) : null}
      {panel === 'move' ? (
        <MoveSamplePanel
          sampleCode={sample.code}
          current={location}
          onDone={() => setPanel('none')}
          onCancel={() => setPanel('none')}
        />
      ) : null}
      {panel === 'take-out' ? (
        <TakeOutConfirm
          code={sample.code}
          where={locationWords(location)}
          onDone={() => setPanel('none')}
          onCancel={() => setPanel('none')}
        />
      ) : null}
    </Card>
  );
}

function FreeSlot({ box, slot, canWrite, onClose }: { box: Box; slot: BoxSlot; canWrite: boolean; onClose: () => void }) {
  return (
    <Card title={`Slot ${slot.slot} is free`} testID="slot-panel">
      {canWrite ? (
        <PutSampleHere box={box} slot={slot.slot} onClose={onClose} />
      ) : (
        <Text tone="muted">Researchers and lab managers put samples into boxes.</Text>
      )}
    </Card>
  );
}

/** Put a sample here: type its code, find it by name, or go and scan its label. */
function PutSampleHere({ box, slot, onClose }: { box: Box; slot: string; onClose: () => void }) {
  const [text, setText] = useState('');
  const settled = useDebouncedValue(text);
  const read = readCode(text);
  const exact = read.kind === 'sample' ? read.code : null;
  const search = useSampleSearchQuery(exact || read.kind === 'typo' ? '' : settled);
  const move = useMoveSampleMutation();

  const put = (code: string) => move.mutate({ code, boxCode: box.code, slot });

  return (
    <View style={styles.put}>
      <TextField
        label="Put a sample here"
        hint="Type its code (read off the label) or part of its name."
        value={text}
        onChangeText={(next) => {
          setText(next);
          move.reset();
        }}
        autoCapitalize="characters"
        autoCorrect={false}
        autoComplete="off"
        inputMode="search"
        errors={read.kind === 'typo' ? [read.message] : []}
        onSubmitEditing={() => (exact ? put(exact) : undefined)}
        testID="put-sample-input"
      />
      {exact ? (
        <Button
          title={`Put ${exact} in ${slot}`}
          icon="enter-outline"
          onPress={() => put(exact)}
          loading={move.isPending}
          testID="put-sample-submit"
        />
      ) : read.kind === 'typo' ? null : (
        <SearchResults text={settled} query={search} onPick={(sample) => put(sample.code)} busy={move.isPending} />
      )}
      <FormProblem title={`Could not put it in ${slot}`} error={move.error} />
      <View style={styles.actions}>
        <Link href={{ pathname: '/scan', params: { mode: 'move', box: box.code, slot } }} asChild>
          <Button title="Scan its label instead" icon="scan-outline" variant="secondary" testID="put-sample-scan" />
        </Link>
        <Button title="Close" variant="quiet" onPress={onClose} testID="slot-close" />
      </View>
    </View>
  );
}

interface SearchResultsProps {
  text: string;
  query: ReturnType<typeof useSampleSearchQuery>;
  onPick: (sample: SampleListRow) => void;
  busy: boolean;
}

function SearchResults({ text, query, onPick, busy }: SearchResultsProps) {
  const { colors } = useTheme();
  if (text.trim().length < SEARCH_MIN_LENGTH) return null;
  if (query.isError) return <Text tone="danger">{describeError(query.error)}</Text>;
  if (!query.data) {
    return (
      <View style={styles.legendItem}>
        <ActivityIndicator color={colors.primary} />
        <Text tone="muted">Searching…</Text>
      </View>
    );
  }
  if (query.data.length === 0) return <Text tone="muted">{`No sample matches “${text.trim()}”.`}</Text>;
  return (
    <View style={styles.results} role="list" accessibilityLabel="Matching samples">
      {query.data.map((sample) => (
        <Pressable
          key={sample.code}
          role="listitem"
          accessibilityRole="button"
          accessibilityLabel={`Put ${sample.code} here`}
          disabled={busy}
          onPress={() => onPick(sample)}
          testID={`put-sample-result-${sample.code}`}
          style={({ pressed }) => [
            styles.result,
            { borderColor: colors.hairline, backgroundColor: pressed ? colors.sunken : colors.surface },
          ]}
        >
          <View style={styles.resultText}>
            <Text variant="code" tone="primary">
              {sample.code}
            </Text>
            <Text variant="caption" tone="muted" numberOfLines={1}>
              {[SAMPLE_KIND_LABELS[sample.kind], sample.material, sample.name].filter(Boolean).join(' · ')}
            </Text>
          </View>
          <Text variant="label" tone="primary">
            Put here
          </Text>
        </Pressable>
      ))}
    </View>
  );
}

const SWATCH = space.lg;

const styles = StyleSheet.create({
  legend: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
  legendItem: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  swatch: { width: SWATCH, height: SWATCH, borderRadius: radii.sm, borderWidth: sizes.outline },
  free: { borderStyle: 'dashed' },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  put: { gap: space.md },
  results: { gap: space.xs },
  result: {
    minHeight: sizes.touchTarget,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    paddingHorizontal: space.md,
    paddingVertical: space.sm,
    borderRadius: radii.md,
    borderWidth: sizes.hairline,
  },
  resultText: { flex: 1, minWidth: 0, gap: space.xxs },
});
