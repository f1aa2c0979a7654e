import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { CalibrationCreateInput, type MicroscopeCalibration } from '@/shared/schemas/evidence';
import { canWriteSamples } from '@/components/samples/writers-only';
import { sizes, space, useTheme } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { CheckToggle } from '@/components/ui/check-toggle';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { errorsFromIssues, errorsFromRequest, type PathErrors } from '@/components/ui/field-errors';
import { formatDate } from '@/components/ui/format';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { EmptyState, ErrorState, LoadingState } from '@/components/ui/state-views';
import { Text } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { useCalibrationsQuery, useCreateCalibrationMutation, useRetireCalibrationMutation } from '@/hooks/use-calibrations';
import { useSessionQuery } from '@/hooks/use-session';
import { formatNumber, numberFromText } from './number-text';

/** Objectives found on most flake-hunting microscopes (common practice, no source). */
const OBJECTIVES = ['5', '10', '20', '50', '100'] as const;
const OBJECTIVE_CHOICES = [...OBJECTIVES.map((value) => ({ value, label: `${value}×` })), { value: 'other', label: 'Other' }];

export function CalibrationsScreen() {
  const session = useSessionQuery();
  const canWrite = canWriteSamples(session.data);
  const [showRetired, setShowRetired] = useState(false);
  const calibrations = useCalibrationsQuery({ includeRetired: showRetired });

  return (
    <Screen
      title="Microscope calibrations"
      lead="Micrometres per camera pixel for each microscope and objective, so areas on micrographs are real areas."
      testID="calibrations-screen"
    >
      {canWrite ? <AddCalibrationCard /> : null}
      <Card title={showRetired ? 'All calibrations' : 'Current calibrations'} testID="calibrations-list">
        <CheckToggle
          label="Show retired ones too"
          checked={showRetired}
          onChange={setShowRetired}
          testID="calibrations-show-retired"
        />
        {calibrations.data ? (
          calibrations.data.length === 0 ? (
            <EmptyState icon="scan-circle-outline" title="No calibrations yet">
              Image a stage micrometer (a ruled scale) with each objective, count the pixels between two rulings far apart, and
              enter the distance divided by the pixel count here.
            </EmptyState>
          ) : (
            <View style={styles.rows}>
              {calibrations.data.map((calibration) => (
                <CalibrationRow key={calibration.id} calibration={calibration} canWrite={canWrite} />
              ))}
            </View>
          )
        ) : calibrations.isError ? (
          <ErrorState
            title="Could not load the calibrations"
            error={calibrations.error}
            onRetry={() => void calibrations.refetch()}
            retrying={calibrations.isFetching}
          />
        ) : (
          <LoadingState label="Loading calibrations…" />
        )}
      </Card>
    </Screen>
  );
}

function CalibrationRow({ calibration, canWrite }: { calibration: MicroscopeCalibration; canWrite: boolean }) {
  const { colors } = useTheme();
  const retire = useRetireCalibrationMutation();
  const [confirming, setConfirming] = useState(false);
  const retired = calibration.retiredAt !== null;
  return (
    <View style={[styles.row, { borderColor: colors.hairline }]} testID={`calibration-${calibration.id}`}>
      <View style={styles.rowText}>
        <Text variant="label">{`${calibration.microscope} · ${formatNumber(calibration.objectiveMagnification)}×`}</Text>
        <Text variant="heading">{`${formatNumber(calibration.umPerPixel, 4)} µm per pixel`}</Text>
        {calibration.note ? <Text variant="caption">{calibration.note}</Text> : null}
        <Text variant="caption" tone="muted">
          {[
            `Added ${formatDate(calibration.createdAt)}`,
            calibration.createdBy ? `by ${calibration.createdBy.displayName}` : null,
            retired && calibration.retiredAt ? `retired ${formatDate(calibration.retiredAt)}` : null,
          ]
            .filter(Boolean)
            .join(' ')}
        </Text>
        {retire.isError ? <FormProblem title="Could not retire the calibration" error={retire.error} /> : null}
      </View>
      {canWrite && !retired ? (
        <View style={styles.rowActions}>
          {confirming ? (
            <>
              <Button
                title="Retire it"
                variant="danger"
                loading={retire.isPending}
                onPress={() => retire.mutate(calibration.id, { onSuccess: () => setConfirming(false) })}
                testID={`calibration-${calibration.id}-retire-confirm`}
              />
              <Button title="Keep" variant="quiet" onPress={() => setConfirming(false)} />
            </>
          ) : (
            <Button
              title="Retire"
              variant="secondary"
              icon="archive-outline"
              onPress={() => setConfirming(true)}
              testID={`calibration-${calibration.id}-retire`}
            />
          )}
        </View>
      ) : null}
    </View>
  );
}

interface CalibrationValues {
  microscope: string;
  objective: string;
  objectiveOther: string;
  umPerPixel: string;
  note: string;
}

const EMPTY: CalibrationValues = { microscope: '', objective: '', objectiveOther: '', umPerPixel: '', note: '' };

function AddCalibrationCard() {
  const create = useCreateCalibrationMutation();
  const [values, setValues] = useState<CalibrationValues>(EMPTY);
  const [errors, setErrors] = useState<PathErrors>({});
  const [added, setAdded] = useState<MicroscopeCalibration | null>(null);

  const change = (patch: Partial<CalibrationValues>) => {
    setValues((current) => ({ ...current, ...patch }));
    setErrors({});
    setAdded(null);
    create.reset();
  };

  const submit = () => {
    const parsed = CalibrationCreateInput.safeParse({
      microscope: values.microscope,
      objectiveMagnification: numberFromText(values.objective === 'other' ? values.objectiveOther : values.objective),
      umPerPixel: numberFromText(values.umPerPixel),
      note: values.note.trim() || undefined,
    });
    if (!parsed.success) {
      setErrors(errorsFromIssues(parsed.error.issues));
      return;
    }
    create.mutate(parsed.data, {
      onSuccess: (calibration) => {
        setValues(EMPTY);
        setAdded(calibration);
      },
      onError: (error) => setErrors(errorsFromRequest(error)),
    });
  };

  return (
    <Card
      title="Add a calibration"
      lead="A new one for the same microscope and objective replaces the current one; micrographs keep the one they were taken with."
      testID="calibration-add"
    >
      <TextField
        label="Microscope"
        hint="As the lab calls it, e.g. “Upright scope, room 2”."
        value={values.microscope}
        onChangeText={(microscope) => change({ microscope })}
        errors={errors.microscope}
        autoComplete="off"
        testID="calibration-microscope"
      />
      <ChoiceChips
        label="Objective"
        choices={OBJECTIVE_CHOICES}
        value={values.objective || null}
        onChange={(objective) => change({ objective })}
        errors={values.objective === 'other' ? undefined : errors.objectiveMagnification}
        testID="calibration-objective"
      />
      {values.objective === 'other' ? (
        <TextField
          label="Objective magnification"
          value={values.objectiveOther}
          onChangeText={(objectiveOther) => change({ objectiveOther })}
          errors={errors.objectiveMagnification}
          inputMode="decimal"
          keyboardType="decimal-pad"
          testID="calibration-objective-other"
        />
      ) : null}
      <TextField
        label="Micrometres per pixel"
        hint="Distance between two rulings of a stage micrometer, divided by the pixels between them."
        value={values.umPerPixel}
        onChangeText={(umPerPixel) => change({ umPerPixel })}
        errors={errors.umPerPixel}
        inputMode="decimal"
        keyboardType="decimal-pad"
        testID="calibration-um-per-pixel"
      />
      <TextField
        label="Note (optional)"
        value={values.note}
        onChangeText={(note) => change({ note })}
        errors={errors.note}
        testID="calibration-note"
      />
      <FormProblem title="Could not add the calibration" error={create.error} />
      {added ? (
        <Notice tone="success" title="Calibration added" testID="calibration-added">
          {`${added.microscope} at ${formatNumber(added.objectiveMagnification)}×: ${formatNumber(added.umPerPixel, 4)} µm per pixel.`}
        </Notice>
      ) : null}
      <Button title="Add calibration" icon="add" loading={create.isPending} onPress={submit} block testID="calibration-submit" />
    </Card>
  );
}

const styles = StyleSheet.create({
  rows: { gap: space.sm },
  row: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    alignItems: 'center',
    gap: space.md,
    paddingVertical: space.md,
    borderTopWidth: sizes.hairline,
  },
  rowText: { flexGrow: 1, flexShrink: 1, flexBasis: 220, gap: space.xxs },
  rowActions: { flexDirection: 'row', gap: space.sm },
});
