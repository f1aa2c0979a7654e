import { useState, type ReactNode } from 'react';
import { Modal, Pressable, ScrollView, StyleSheet, View } from 'react-native';
import type { LabelTemplate } from '@/shared/schemas/labels';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { Button, type ButtonVariant } from '@/components/ui/button';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { Notice } from '@/components/ui/notice';
import { ErrorState, LoadingState } from '@/components/ui/state-views';
import { Heading, Text } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { describeError } from '@/hooks/api-client';
import { useBreakpoints } from '@/hooks/use-breakpoints';
import { readDevicePreference, writeDevicePreference } from '@/hooks/device-preferences';
import { labelSheetPath, openLabelSheet, useLabelTemplatesQuery, type LabelTarget } from '@/hooks/use-labels';
import { useSessionQuery } from '@/hooks/use-session';

export interface PrintLabelsButtonProps {
  target: LabelTarget;
  /** What the sheet will hold, in words: "The label of CH-…", "Labels for the 3 samples this step made". */
  what: string;
  title?: string;
  variant?: ButtonVariant;
  disabled?: boolean;
  testID?: string;
}

/** "Print labels": opens the sheet that picks the label stock and opens the PDF. */
export function PrintLabelsButton({
  target,
  what,
  title = 'Print labels',
  variant = 'secondary',
  disabled = false,
  testID,
}: PrintLabelsButtonProps) {
  const [open, setOpen] = useState(false);
  return (
    <>
      <Button
        title={title}
        icon="print-outline"
        variant={variant}
        disabled={disabled}
        onPress={() => setOpen(true)}
        testID={testID ?? 'print-labels'}
      />
      {open ? <PrintLabelsSheet target={target} what={what} onClose={() => setOpen(false)} /> : null}
    </>
  );
}

/** Which template this person last printed on, kept on this device. */
const preferenceKey = (userId: number | undefined) => `label-template.${userId ?? 'anyone'}`;

/** The name already gives the label size; this adds what the name may not. */
function describeTemplate(template: LabelTemplate): string {
  const count = template.columns * template.rows;
  return `${template.shape === 'round' ? 'Round' : 'Rectangular'} · ${count} ${count === 1 ? 'label' : 'labels'} per page`;
}

export interface PrintLabelsSheetProps {
  /** Null while the codes to print are still being gathered (see `status`). */
  target: LabelTarget | null;
  what: string;
  /** Shown above the template choice, e.g. what is being gathered or a choice of what to print. */
  status?: ReactNode;
  onClose: () => void;
}

/**
 * A small sheet over the screen (from the bottom on phones, centred on wider screens): choose
 * the label stock, optionally skip labels already used on a part-used sheet, open the PDF.
 */
export function PrintLabelsSheet({ target, what, status, onClose }: PrintLabelsSheetProps) {
  const { colors } = useTheme();
  const { isPhone } = useBreakpoints();
  const session = useSessionQuery();
  const templates = useLabelTemplatesQuery();
  const key = preferenceKey(session.data?.id);
  const [chosen, setChosen] = useState<string | null>(() => readDevicePreference(key));
  const [skip, setSkip] = useState('');
  const [problem, setProblem] = useState<string | null>(null);

  const list = templates.data ?? [];
  // The remembered template may have been removed since; then the first one is offered.
  const selected = list.find((template) => String(template.id) === chosen) ?? list[0] ?? null;
  const skipCount = skip.trim() === '' ? 0 : Number(skip);
  const skipValid = Number.isInteger(skipCount) && skipCount >= 0;
  const perSheet = selected ? selected.columns * selected.rows : 0;
  const skipTooMany = skipValid && selected !== null && skipCount >= perSheet;

  const open = () => {
    if (!target || !selected || !skipValid || skipTooMany) return;
    writeDevicePreference(key, String(selected.id));
    setProblem(null);
    openLabelSheet(labelSheetPath(target, selected.id, skipCount))
      .then(onClose)
      .catch((error: unknown) => setProblem(describeError(error)));
  };

  return (
    <Modal transparent visible animationType="fade" onRequestClose={onClose}>
      <View style={[styles.layer, isPhone ? styles.layerPhone : styles.layerWide]}>
        <Pressable
          style={[StyleSheet.absoluteFill, styles.scrim, { backgroundColor: colors.ink }]}
          onPress={onClose}
          accessibilityRole="button"
          accessibilityLabel="Close without printing"
        />
        <View
          role="dialog"
          aria-modal
          aria-label="Print labels"
          testID="print-sheet"
          style={[
            styles.sheet,
            isPhone ? styles.sheetPhone : styles.sheetWide,
            { backgroundColor: colors.surface, borderColor: colors.hairline },
          ]}
        >
          <ScrollView contentContainerStyle={styles.content} keyboardShouldPersistTaps="handled">
            <View style={styles.heading}>
              <Heading level={2}>Print labels</Heading>
              <Text tone="muted" testID="print-sheet-what">
                {what}
              </Text>
            </View>
            {status}
            {templates.data ? (
              list.length === 0 ? (
                <Notice tone="info" title="No label sheets are set up">
                  A lab manager adds the label stock the lab uses; then labels can be printed here.
                </Notice>
              ) : (
                <>
                  <ChoiceGroup
                    label="Label sheet"
                    choices={list.map((template) => ({
                      value: String(template.id),
                      label: template.name,
                      description: describeTemplate(template),
                    }))}
                    value={selected ? String(selected.id) : null}
                    onChange={setChosen}
                    testID="print-template"
                  />
                  <TextField
                    label="Labels already used on the first sheet"
                    hint="To use up a part-used sheet: printing starts after this many positions."
                    value={skip}
                    onChangeText={setSkip}
                    inputMode="numeric"
                    keyboardType="number-pad"
                    placeholder="0"
                    errors={
                      !skipValid
                        ? ['Enter a whole number, or leave it empty.']
                        : skipTooMany
                          ? [`This sheet has ${perSheet} positions; skip fewer than that.`]
                          : []
                    }
                    testID="print-skip"
                  />
                </>
              )
            ) : templates.isError ? (
              <ErrorState
                title="Could not load the label sheets"
                error={templates.error}
                onRetry={() => void templates.refetch()}
                retrying={templates.isFetching}
              />
            ) : (
              <LoadingState label="Loading label sheets…" />
            )}
            {problem ? (
              <Notice tone="error" title="Could not open the labels">
                {problem}
              </Notice>
            ) : null}
            <View style={styles.actions}>
              <Button
                title="Open the PDF"
                icon="open-outline"
                onPress={open}
                disabled={!target || !selected || !skipValid || skipTooMany}
                testID="print-open"
              />
              <Button title="Cancel" variant="quiet" onPress={onClose} testID="print-cancel" />
            </View>
          </ScrollView>
        </View>
      </View>
    </Modal>
  );
}

/** The sheet never covers the whole phone screen: the record underneath stays in view. */
const PHONE_SHEET_MAX_HEIGHT = '88%';

const styles = StyleSheet.create({
  layer: { flex: 1 },
  layerPhone: { justifyContent: 'flex-end' },
  layerWide: { justifyContent: 'center', alignItems: 'center', padding: space.xxl },
  scrim: { opacity: 0.45 },
  sheet: { borderWidth: sizes.hairline, overflow: 'hidden' },
  sheetPhone: {
    borderTopLeftRadius: radii.lg,
    borderTopRightRadius: radii.lg,
    maxHeight: PHONE_SHEET_MAX_HEIGHT,
  },
  sheetWide: { width: '100%', maxWidth: sizes.readingWidth, borderRadius: radii.lg, maxHeight: '100%' },
  content: { padding: space.xl, gap: space.lg },
  heading: { gap: space.xs },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
