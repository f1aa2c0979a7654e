import Ionicons from '@expo/vector-icons/Ionicons';
import { useCallback, useState, type ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';
import { SAMPLE_KIND_LABELS } from '@/shared/samples';
import type { Sample } from '@/shared/schemas/sample';
import { parseSlot, slotName } from '@/shared/slots';
import { fontFaces, radii, sizes, space, useTheme } from '@/components/theme';
import { BoxGrid } from '@/components/boxes/box-grid';
import { locationWords } from '@/components/boxes/location-words';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { errorsFromRequest } from '@/components/ui/field-errors';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { Text } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { describeError } from '@/hooks/api-client';
import type { FoundRecord, RecordRef } from '@/hooks/use-scan';
import { useBoxQuery, useMoveSampleMutation } from '@/hooks/use-storage';

export interface MoveChainState {
  sample: Sample | null;
  boxCode: string | null;
  slot: string;
  /** The last sample put away, to confirm it while the next one is scanned. */
  done: { code: string; where: string } | null;
}

export interface MoveChain {
  state: MoveChainState;
  /** Takes a scanned or typed record into the chain: a sample is step 1, a box step 2. */
  accept: (found: FoundRecord) => void;
  /** True when the chain already holds this record (the camera sees the same label many times a second). */
  holds: (ref: RecordRef) => boolean;
  setSlot: (slot: string) => void;
  clearSample: () => void;
  clearBox: () => void;
  finish: (where: string) => void;
}

/**
 * Putting samples away by scanning: a sample, then a box (in either order), then a slot. After
 * each move the box stays chosen, so a tray of samples goes into one box scan by scan.
 */
export function useMoveChain(initial: { boxCode: string | null; slot: string | null }): MoveChain {
  const [state, setState] = useState<MoveChainState>({
    sample: null,
    boxCode: initial.boxCode,
    slot: initial.slot ?? '',
    done: null,
  });

  const accept = useCallback((found: FoundRecord) => {
    setState((current) =>
      found.kind === 'sample'
        ? { ...current, sample: found.sample, done: null }
        : {
            ...current,
            boxCode: found.box.code,
            slot: found.box.code === current.boxCode ? current.slot : '',
          },
    );
  }, []);

  const holds = useCallback(
    (ref: RecordRef) => (ref.kind === 'sample' ? state.sample?.code === ref.code : state.boxCode === ref.code),
    [state.sample, state.boxCode],
  );

  return {
    state,
    accept,
    holds,
    setSlot: useCallback((slot: string) => setState((current) => ({ ...current, slot })), []),
    clearSample: useCallback(() => setState((current) => ({ ...current, sample: null })), []),
    clearBox: useCallback(() => setState((current) => ({ ...current, boxCode: null, slot: '' })), []),
    finish: useCallback(
      (where: string) =>
        setState((current) => ({
          ...current,
          sample: null,
          slot: '',
          done: current.sample ? { code: current.sample.code, where } : null,
        })),
      [],
    ),
  };
}

/** What the camera should be pointed at next. */
export function movePrompt(state: MoveChainState): string {
  if (!state.sample) return state.done ? 'Scan the next sample’s label' : 'Scan the sample’s label';
  if (!state.boxCode) return 'Now scan the box’s label';
  return 'Choose a slot below, or scan another sample';
}

/** The three steps of a move and where each stands, with the slot choice once both are known. */
export function MoveChainPanel({ chain }: { chain: MoveChain }) {
  const { state } = chain;
  const box = useBoxQuery(state.boxCode ?? '', { enabled: state.boxCode !== null });
  const move = useMoveSampleMutation();
  const sample = state.sample;
  const record = box.data ?? null;

  const position = record ? parseSlot(state.slot, record) : null;
  const selectedSlot = record && position ? slotName(position.row, position.column, record.rowLabels, record.columnLabels) : null;
  const slotErrors = errorsFromRequest(move.error).slot ?? [];

  const put = () => {
    if (!sample || !record || !state.slot.trim()) return;
    move.mutate(
      { code: sample.code, boxCode: record.code, slot: state.slot.trim() },
      {
        onSuccess: (answer) =>
          chain.finish(answer.location ? locationWords(answer.location) : `${record.name}, slot ${state.slot.trim()}`),
      },
    );
  };

  return (
    <Card title="Put samples away" lead="Scan a sample, then its box, then choose the slot." testID="move-chain">
      {state.done ? (
        <Notice tone="success" title={`${state.done.code} is put away`} testID="move-done">
          {`${state.done.where}. Scan the next sample for the same box, or another box.`}
        </Notice>
      ) : null}
      <Step
        number={1}
        done={sample !== null}
        title={sample ? `Sample ${sample.code}` : 'Scan the sample'}
        detail={
          sample
            ? [SAMPLE_KIND_LABELS[sample.kind], sample.material, sample.name].filter(Boolean).join(' · ')
            : 'Its label, or type its code below.'
        }
        action={sample ? <Button title="Change" variant="quiet" onPress={chain.clearSample} testID="move-change-sample" /> : null}
        testID="move-step-sample"
      />
      <Step
        number={2}
        done={record !== null}
        title={record ? `Box ${record.name}` : state.boxCode ? `Box ${state.boxCode}` : 'Scan the box'}
        detail={
          record
            ? `${record.code} · ${record.placePath ?? 'Not in a place'}`
            : box.isError
              ? describeError(box.error)
              : state.boxCode
                ? 'Looking it up…'
                : 'The label on the box’s lid or side.'
        }
        action={
          state.boxCode ? <Button title="Change" variant="quiet" onPress={chain.clearBox} testID="move-change-box" /> : null
        }
        testID="move-step-box"
      />
      <Step
        number={3}
        done={false}
        title={selectedSlot ? `Slot ${selectedSlot}` : 'Choose a slot'}
        detail={sample && record ? 'Tap a free slot, or type its name.' : 'Once the sample and the box are known.'}
        testID="move-step-slot"
      />
      {sample && record ? (
        <View style={styles.slot}>
          <BoxGrid
            box={record}
            selectedSlot={selectedSlot}
            onSelect={(entry) => {
              chain.setSlot(entry.slot);
              move.reset();
            }}
            mode="pick"
            testIDPrefix="chain-slot"
          />
          <TextField
            label="Slot"
            hint={`From ${record.slots[0]?.slot ?? ''} to ${record.slots[record.slots.length - 1]?.slot ?? ''}`}
            value={state.slot}
            onChangeText={(text) => {
              chain.setSlot(text);
              move.reset();
            }}
            onSubmitEditing={put}
            autoCapitalize="characters"
            autoCorrect={false}
            autoComplete="off"
            errors={slotErrors}
            testID="chain-slot-input"
          />
          {slotErrors.length === 0 ? <FormProblem title="Could not put it there" error={move.error} /> : null}
          <Button
            title={state.slot.trim() ? `Put ${sample.code} in ${state.slot.trim().toUpperCase()}` : 'Choose a slot first'}
            icon="enter-outline"
            onPress={put}
            disabled={!state.slot.trim()}
            loading={move.isPending}
            testID="chain-put"
          />
        </View>
      ) : null}
    </Card>
  );
}

interface StepProps {
  number: number;
  done: boolean;
  title: string;
  detail: string;
  action?: ReactNode;
  testID: string;
}

function Step({ number, done, title, detail, action, testID }: StepProps) {
  const { colors } = useTheme();
  return (
    <View style={styles.step} testID={testID} accessibilityLabel={`Step ${number}: ${title}${done ? ', done' : ''}. ${detail}`}>
      <View
        style={[
          styles.badge,
          done
            ? { backgroundColor: colors.successSoft, borderColor: colors.successSoft }
            : { backgroundColor: colors.surface, borderColor: colors.outline },
        ]}
      >
        {done ? (
          <Ionicons name="checkmark" size={sizes.iconSmall} color={colors.onSuccessSoft} />
        ) : (
          <Text variant="label" style={styles.number}>
            {String(number)}
          </Text>
        )}
      </View>
      <View style={styles.stepText}>
        <Text variant="label" style={done ? { color: colors.onSuccessSoft } : null} testID={`${testID}-title`}>
          {title}
        </Text>
        <Text variant="caption" tone="muted">
          {detail}
        </Text>
      </View>
      {action}
    </View>
  );
}

const BADGE = space.xxl;

const styles = StyleSheet.create({
  step: { flexDirection: 'row', alignItems: 'center', gap: space.md, minHeight: sizes.touchTarget },
  badge: {
    width: BADGE,
    height: BADGE,
    borderRadius: radii.pill,
    borderWidth: sizes.outline,
    alignItems: 'center',
    justifyContent: 'center',
  },
  number: { fontFamily: fontFaces.sansSemiBold },
  stepText: { flex: 1, minWidth: 0, gap: space.xxs },
  slot: { gap: space.md },
});
