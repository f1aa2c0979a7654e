import { useState } from 'react';
import { ActivityIndicator, StyleSheet, View } from 'react-native';
import { space, useTheme } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { Text } from '@/components/ui/text';
import { describeError } from '@/hooks/api-client';
import { LABEL_BATCH_MAX, useResultCodesQuery } from '@/hooks/use-labels';
import type { SampleListFilters } from '@/hooks/use-samples';
import { PrintLabelsSheet } from './print-labels';

export interface ListPrintLabelsProps {
  filters: SampleListFilters;
  /** Switches the list to choosing samples one by one. */
  onChooseSamples: () => void;
}

/** "Print labels" above the sample list: labels for everything it shows, or for a chosen few. */
export function ListPrintLabels({ filters, onChooseSamples }: ListPrintLabelsProps) {
  const [open, setOpen] = useState(false);
  return (
    <>
      <Button
        title="Print labels"
        icon="print-outline"
        variant="secondary"
        onPress={() => setOpen(true)}
        testID="samples-print-labels"
      />
      {open ? (
        <ResultsSheet
          filters={filters}
          onClose={() => setOpen(false)}
          onChooseSamples={() => {
            setOpen(false);
            onChooseSamples();
          }}
        />
      ) : null}
    </>
  );
}

function ResultsSheet({ filters, onClose, onChooseSamples }: ListPrintLabelsProps & { onClose: () => void }) {
  const { colors } = useTheme();
  const results = useResultCodesQuery(filters);
  const data = results.data;
  const what = !data
    ? 'Labels for the samples this list shows.'
    : data.total === 0
      ? 'This list shows no samples.'
      : data.total > LABEL_BATCH_MAX
        ? `Labels for the first ${LABEL_BATCH_MAX} of the ${data.total} samples this list shows (the most one PDF holds). Narrow the list to print the rest.`
        : `Labels for the ${data.total} ${data.total === 1 ? 'sample' : 'samples'} this list shows.`;

  const status = (
    <View style={styles.status}>
      {results.isError ? (
        <Notice
          tone="error"
          title="Could not gather the codes"
          action={<Button title="Try again" icon="refresh" variant="secondary" onPress={() => void results.refetch()} />}
        >
          {describeError(results.error)}
        </Notice>
      ) : !data ? (
        <View style={styles.row} accessibilityRole="progressbar" accessibilityLabel="Gathering the codes">
          <ActivityIndicator color={colors.primary} />
          <Text tone="muted">Gathering the codes…</Text>
        </View>
      ) : null}
      <Button
        title="Choose samples one by one instead"
        icon="checkbox-outline"
        variant="quiet"
        onPress={onChooseSamples}
        testID="print-choose-samples"
      />
    </View>
  );

  return (
    <PrintLabelsSheet
      target={data && data.codes.length > 0 ? { kind: 'samples', codes: data.codes } : null}
      what={what}
      status={status}
      onClose={onClose}
    />
  );
}

const styles = StyleSheet.create({
  status: { gap: space.sm },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
});
