import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { Box } from '@/shared/schemas/storage';
import { sizes, space } from '@/components/theme';
import { PrintLabelsButton } from '@/components/labels/print-labels';
import { canWriteSamples } from '@/components/samples/writers-only';
import { Card } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { ErrorState, LoadingState } from '@/components/ui/state-views';
import { TextLink } from '@/components/ui/text-link';
import { describeError, isApiError } from '@/hooks/api-client';
import { useBreakpoints } from '@/hooks/use-breakpoints';
import { useSessionQuery } from '@/hooks/use-session';
import { useBoxQuery } from '@/hooks/use-storage';
import { BoxGrid } from './box-grid';
import { occupancyWords } from './location-words';
import { SlotPanel } from './slot-panel';

/** The slot panel beside the grid on wide screens. */
const PANEL_WIDTH = sizes.listPaneWidth - space.xxxl;

const back = (
  <TextLink href="/boxes" testID="boxes-back">
    ← All boxes
  </TextLink>
);

/** One box: its grid of slots, what sits in each, and putting samples in and taking them out. */
export function BoxScreen({ code }: { code: string }) {
  const box = useBoxQuery(code);

  if (!box.data) {
    if (isApiError(box.error, 'not_found', 'code_typo')) {
      const typo = isApiError(box.error, 'code_typo');
      return (
        <Screen title="Box" above={back} testID="box-screen">
          <Notice tone="warn" title={typo ? 'That code has a typo' : `No box has the code ${code}`} testID="box-missing">
            {typo ? describeError(box.error) : 'Check the code against the box’s label, or find the box in the list.'}
          </Notice>
        </Screen>
      );
    }
    return (
      <Screen title="Box" above={back} testID="box-screen">
        {box.isError ? (
          <ErrorState
            title={`Could not load ${code}`}
            error={box.error}
            onRetry={() => void box.refetch()}
            retrying={box.isFetching}
          />
        ) : (
          <LoadingState label={`Loading ${code}…`} />
        )}
      </Screen>
    );
  }

  return <BoxView box={box.data} />;
}

function BoxView({ box }: { box: Box }) {
  const session = useSessionQuery();
  const { isWide } = useBreakpoints();
  const [selected, setSelected] = useState<string | null>(null);
  const slot = box.slots.find((entry) => entry.slot === selected) ?? null;
  const canWrite = canWriteSamples(session.data);

  const actions = (
    <PrintLabelsButton
      target={{ kind: 'box', code: box.code }}
      what={`The label of box ‘${box.name}’ (${box.code}).`}
      testID="box-print-labels"
    />
  );

  const panel = <SlotPanel box={box} slot={slot} canWrite={canWrite} onClose={() => setSelected(null)} />;

  return (
    <Screen
      title={box.name}
      lead={`${box.code} · ${box.placePath ?? 'Not in a place'} · ${occupancyWords(box)}`}
      above={back}
      actions={actions}
      width="wide"
      testID="box-screen"
    >
      {box.note ? <Notice tone="info">{box.note}</Notice> : null}
      <View style={[styles.layout, isWide && styles.layoutWide]}>
        <Card style={styles.gridCard} testID="box-grid-card">
          <BoxGrid box={box} selectedSlot={selected} onSelect={(entry) => setSelected(entry.slot)} />
        </Card>
        <View style={isWide ? styles.panelWide : null}>{panel}</View>
      </View>
    </Screen>
  );
}

const styles = StyleSheet.create({
  layout: { gap: space.lg },
  layoutWide: { flexDirection: 'row', alignItems: 'flex-start' },
  gridCard: { flexGrow: 1, flexShrink: 1, minWidth: 0, padding: space.lg },
  panelWide: { width: PANEL_WIDTH },
});
