import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { MEASUREMENT_AXES, type DeviceMeasurement } from '@/shared/schemas/device';
import { formatNumber } from '@/shared/zone-plate';
import { SectionStatus } from '@/components/samples/section-status';
import { space, useTheme, sizes } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { formatDateTime } from '@/components/ui/format';
import { Notice } from '@/components/ui/notice';
import { Heading, Text } from '@/components/ui/text';
import { describeError } from '@/hooks/api-client';
import { useDeleteMeasurementMutation, useMeasurementsQuery } from '@/hooks/use-devices';
import { FigureTable } from './figure-table';
import { MeasurementForm } from './measurement-form';
import { MeasurementPlot } from './measurement-plot';

/** What was measured on a device, each set as a plot beside the design's prediction and a table. */
export function MeasurementsCard({ code, canWrite }: { code: string; canWrite: boolean }) {
  const measurements = useMeasurementsQuery(code);
  const [adding, setAdding] = useState(false);
  return (
    <Card
      title="Measurements"
      lead="Focal length at each test wavelength, or focal length and efficiency against gate voltage, beside what the design predicts."
      testID="device-measurements"
    >
      {!measurements.data ? (
        <SectionStatus query={measurements} what="the measurements" />
      ) : measurements.data.length === 0 ? (
        <Text tone="muted" testID="measurements-none">
          Nothing measured yet.
        </Text>
      ) : (
        measurements.data.map((measurement) => (
          <MeasurementView key={measurement.id} code={code} measurement={measurement} canWrite={canWrite} />
        ))
      )}
      {canWrite && adding ? <MeasurementForm code={code} onDone={() => setAdding(false)} /> : null}
      {canWrite && !adding ? (
        <Button
          title="Add a measurement"
          icon="add"
          variant="secondary"
          onPress={() => setAdding(true)}
          testID="measurement-add"
        />
      ) : null}
    </Card>
  );
}

/**
 * The design's value at x, read off its curve: exact at the curve's points, linear between them.
 * For the server's dense sampling of f ∝ 1/λ the straight pieces are off by about (Δλ/λ)²/4 of
 * the value, below the four significant figures shown over a few hundred nanometres. Null
 * outside the curve.
 */
function predictedAt(curve: readonly { x: number; y: number }[], x: number): number | null {
  for (let index = 0; index < curve.length; index += 1) {
    const point = curve[index];
    if (point.x === x) return point.y;
    const next = curve[index + 1];
    if (next && point.x < x && x < next.x) return point.y + ((next.y - point.y) * (x - point.x)) / (next.x - point.x);
  }
  return null;
}

function MeasurementView({ code, measurement, canWrite }: { code: string; measurement: DeviceMeasurement; canWrite: boolean }) {
  const { colors } = useTheme();
  const remove = useDeleteMeasurementMutation(code);
  const [confirming, setConfirming] = useState(false);
  const axes = MEASUREMENT_AXES[measurement.kind];
  const curve = [...(measurement.prediction?.curve ?? [])].sort((a, b) => a.x - b.x);
  const predictions = measurement.rows.map((row) => predictedAt(curve, row.x));
  const hasPrediction = predictions.some((value) => value !== null);
  const meta = [formatDateTime(measurement.measuredAt), measurement.measuredBy.displayName, measurement.instrument].filter(
    Boolean,
  );
  return (
    <View style={[styles.measurement, { borderTopColor: colors.hairline }]} testID={`measurement-${measurement.id}`}>
      <Heading level={3}>{axes.title}</Heading>
      <Text variant="caption" tone="muted">
        {meta.join(' · ')}
      </Text>
      {measurement.note ? <Text>{measurement.note}</Text> : null}
      <MeasurementPlot measurement={measurement} />
      <FigureTable
        accessibilityLabel={axes.title}
        columns={[
          `${axes.x.label} (${axes.x.unit})`,
          `${axes.y.label} (${axes.y.unit})`,
          ...(hasPrediction ? [`Design (${axes.y.unit})`] : []),
        ]}
        rows={measurement.rows.map((row, index) => ({
          key: String(index),
          cells: [
            formatNumber(row.x),
            formatNumber(row.y),
            ...(hasPrediction ? [predictions[index] === null ? '—' : formatNumber(predictions[index])] : []),
          ],
        }))}
      />
      {canWrite && !confirming ? (
        <Button
          title="Delete this measurement"
          icon="trash-outline"
          variant="quiet"
          onPress={() => setConfirming(true)}
          testID={`measurement-delete-${measurement.id}`}
        />
      ) : null}
      {canWrite && confirming ? (
        <Notice
          tone="warn"
          title="Delete this measurement?"
          action={
            <>
              <Button
                title="Delete"
                variant="danger"
                loading={remove.isPending}
                onPress={() => remove.mutate(measurement.id)}
                testID={`measurement-delete-confirm-${measurement.id}`}
              />
              <Button title="Keep it" variant="quiet" onPress={() => setConfirming(false)} />
            </>
          }
        >
          The deletion is written to the device’s history.
          {remove.error ? describeError(remove.error) : null}
        </Notice>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  measurement: { gap: space.sm, borderTopWidth: sizes.hairline, paddingTop: space.lg },
});
