import Ionicons from '@expo/vector-icons/Ionicons';
import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';
import type { SampleLocation } from '@/shared/schemas/sample';
import type { BoxSummary } from '@/shared/schemas/storage';
import { parseSlot, slotName } from '@/shared/slots';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { errorsFromRequest } from '@/components/ui/field-errors';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { ErrorState, LoadingState } from '@/components/ui/state-views';
import { Text } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { useBoxesQuery, useBoxQuery, useMoveSampleMutation } from '@/hooks/use-storage';
import { BoxGrid } from './box-grid';
import { occupancyWords } from './location-words';

/** More boxes than this and the list gets a filter field. */
const FILTER_FROM = 6;

export interface MoveSamplePanelProps {
  sampleCode: string;
  /** Where the sample is now, if anywhere: its box is chosen to start with. */
  current: SampleLocation | null;
  onDone: () => void;
  onCancel: () => void;
}

/** Put away or move one sample: choose a box, then one of its free slots (tap it or type it). */
export function MoveSamplePanel({ sampleCode, current, onDone, onCancel }: MoveSamplePanelProps) {
  const [boxCode, setBoxCode] = useState<string | null>(current?.boxCode ?? null);
  const [slot, setSlot] = useState('');
  const move = useMoveSampleMutation();

  const slotErrors = errorsFromRequest(move.error).slot ?? [];
  const submit = () => {
    if (!boxCode || !slot.trim()) return;
    move.mutate({ code: sampleCode, boxCode, slot: slot.trim() }, { onSuccess: onDone });
  };

  return (
    <View style={styles.panel} testID="move-panel">
      <Text variant="label">{current ? `Move ${sampleCode} to…` : `Put ${sampleCode} away in…`}</Text>
      <BoxChooser
        selected={boxCode}
        onChoose={(code) => {
          setBoxCode(code);
          setSlot('');
          move.reset();
        }}
      />
      {boxCode ? (
        <SlotChooser
          boxCode={boxCode}
          slot={slot}
          onSlot={(next) => {
            setSlot(next);
            move.reset();
          }}
          errors={slotErrors}
          currentSlot={current?.boxCode === boxCode ? current.slot : null}
        />
      ) : null}
      {slotErrors.length === 0 ? <FormProblem title="Could not put it there" error={move.error} /> : null}
      <View style={styles.actions}>
        <Button
          title={slot.trim() ? `Put it in ${slot.trim().toUpperCase()}` : 'Choose a slot'}
          icon="enter-outline"
          onPress={submit}
          disabled={!boxCode || !slot.trim()}
          loading={move.isPending}
          testID="move-submit"
        />
        <Button title="Cancel" variant="quiet" onPress={onCancel} testID="move-cancel" />
      </View>
    </View>
  );
}

function BoxChooser({ selected, onChoose }: { selected: string | null; onChoose: (code: string) => void }) {
  const boxes = useBoxesQuery();
  const [filter, setFilter] = useState('');

  if (!boxes.data) {
    return boxes.isError ? (
      <ErrorState
        title="Could not load the boxes"
        error={boxes.error}
        onRetry={() => void boxes.refetch()}
        retrying={boxes.isFetching}
      />
    ) : (
      <LoadingState label="Loading boxes…" />
    );
  }
  if (boxes.data.length === 0) {
    return (
      <Notice tone="info" title="No boxes yet">
        A lab manager adds places and boxes on the Boxes screen; then samples can be put away.
      </Notice>
    );
  }

  const needle = filter.trim().toLowerCase();
  const shown = needle
    ? boxes.data.filter((box) => [box.name, box.code, box.placePath ?? ''].some((text) => text.toLowerCase().includes(needle)))
    : boxes.data;

  return (
    <View style={styles.chooser}>
      {boxes.data.length > FILTER_FROM ? (
        <TextField
          label="Find a box"
          hint="Part of its name, code or place"
          value={filter}
          onChangeText={setFilter}
          autoCorrect={false}
          autoComplete="off"
          testID="move-box-filter"
        />
      ) : null}
      <View style={styles.boxes} accessibilityRole="radiogroup" accessibilityLabel="Box">
        {shown.map((box) => (
          <BoxOption key={box.code} box={box} selected={box.code === selected} onPress={() => onChoose(box.code)} />
        ))}
        {shown.length === 0 ? <Text tone="muted">{`No box matches “${filter.trim()}”.`}</Text> : null}
      </View>
    </View>
  );
}

function BoxOption({ box, selected, onPress }: { box: BoxSummary; selected: boolean; onPress: () => void }) {
  const { colors } = useTheme();
  return (
    <Pressable
      accessibilityRole="radio"
      accessibilityLabel={`${box.name}, ${box.placePath ?? 'not in a place'}, ${occupancyWords(box)}`}
      accessibilityState={{ checked: selected }}
      onPress={onPress}
      testID={`move-box-${box.code}`}
      style={({ pressed }) => [
        styles.option,
        {
          borderColor: selected ? colors.primary : colors.hairline,
          borderWidth: selected ? sizes.focusRing - 1 : sizes.hairline,
          backgroundColor: selected ? colors.primarySoft : pressed ? colors.sunken : colors.surface,
        },
      ]}
    >
      <Ionicons
        name={selected ? 'radio-button-on' : 'radio-button-off'}
        size={sizes.icon}
        color={selected ? colors.primary : colors.outline}
      />
      <View style={styles.optionText}>
        <Text variant="label" numberOfLines={1}>
          {box.name}
        </Text>
        <Text variant="caption" tone="muted" numberOfLines={1}>
          {[occupancyWords(box), box.placePath ?? 'Not in a place'].join(' · ')}
        </Text>
      </View>
    </Pressable>
  );
}

interface SlotChooserProps {
  boxCode: string;
  slot: string;
  onSlot: (slot: string) => void;
  errors: string[];
  /** The sample's own slot in this box, if it is already here. */
  currentSlot: string | null;
}

function SlotChooser({ boxCode, slot, onSlot, errors, currentSlot }: SlotChooserProps) {
  const box = useBoxQuery(boxCode);
  if (!box.data) {
    return box.isError ? (
      <ErrorState title="Could not load the box" error={box.error} onRetry={() => void box.refetch()} retrying={box.isFetching} />
    ) : (
      <LoadingState label="Loading the box’s slots…" />
    );
  }
  const record = box.data;
  const position = parseSlot(slot, record);
  const selected = position ? slotName(position.row, position.column, record.rowLabels, record.columnLabels) : null;
  const free = record.slots.filter((entry) => entry.sample === null).length;
  return (
    <View style={styles.chooser}>
      <Text variant="label">{`Slot in ${record.name}`}</Text>
      <Text variant="caption" tone="muted">
        {free === 0
          ? 'Every slot in this box is taken. Choose another box, or take a sample out first.'
          : `${free} free ${free === 1 ? 'slot' : 'slots'}. Tap one, or type its name.${currentSlot ? ` It is in ${currentSlot} now.` : ''}`}
      </Text>
      <BoxGrid
        box={record}
        selectedSlot={selected}
        onSelect={(entry) => onSlot(entry.slot)}
        mode="pick"
        testIDPrefix="move-slot"
      />
      <TextField
        label="Slot"
        hint={`From ${record.slots[0]?.slot ?? ''} to ${record.slots[record.slots.length - 1]?.slot ?? ''}`}
        value={slot}
        onChangeText={onSlot}
        autoCapitalize="characters"
        autoCorrect={false}
        autoComplete="off"
        errors={errors}
        testID="move-slot-input"
      />
    </View>
  );
}

const styles = StyleSheet.create({
  panel: { gap: space.lg, alignSelf: 'stretch' },
  chooser: { gap: space.sm },
  boxes: { gap: space.xs },
  option: {
    minHeight: sizes.touchTarget,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    paddingHorizontal: space.md,
    paddingVertical: space.sm,
    borderRadius: radii.md,
  },
  optionText: { flex: 1, minWidth: 0, gap: space.xxs },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
