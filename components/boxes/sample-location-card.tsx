import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { Sample } from '@/shared/schemas/sample';
import { space } from '@/components/theme';
import { PrintLabelsButton } from '@/components/labels/print-labels';
import { RecordQr } from '@/components/labels/record-qr';
import { canWriteSamples } from '@/components/samples/writers-only';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { DetailRow } from '@/components/ui/detail-row';
import { Text } from '@/components/ui/text';
import { TextLink } from '@/components/ui/text-link';
import { useBreakpoints } from '@/hooks/use-breakpoints';
import { useSessionQuery } from '@/hooks/use-session';
import { locationWords } from './location-words';
import { MoveSamplePanel } from './move-sample-panel';
import { TakeOutConfirm } from './take-out-confirm';

/** Bigger on phones, where another phone may scan it off the screen. */
const QR_SIZE_PHONE = 148;
const QR_SIZE = 120;

type Panel = 'none' | 'move' | 'take-out';

/** A sample's QR label and where it is kept, with printing, putting away and taking out. */
export function SampleLocationCard({ sample }: { sample: Sample }) {
  const session = useSessionQuery();
  const { isPhone } = useBreakpoints();
  const [panel, setPanel] = useState<Panel>('none');
  const canMove = canWriteSamples(session.data) && sample.status !== 'retired';
  const { location } = sample;

  return (
    <Card title="Label and place" testID="sample-location-card">
      <View style={[styles.top, isPhone && styles.topPhone]}>
        <RecordQr code={sample.code} size={isPhone ? QR_SIZE_PHONE : QR_SIZE} testID="sample-qr" />
        <View style={styles.facts}>
          <DetailRow label="Where it is" testID="sample-location">
            {location ? (
              <TextLink href={{ pathname: '/boxes/[code]', params: { code: location.boxCode } }} testID="sample-location-link">
                {locationWords(location)}
              </TextLink>
            ) : (
              <Text testID="sample-location-none">Not put away in a box</Text>
            )}
          </DetailRow>
          <Text variant="caption" tone="muted">
            The label carries this QR code; scanning it opens this record.
          </Text>
        </View>
      </View>
      <View style={styles.actions}>
        <PrintLabelsButton
          target={{ kind: 'samples', codes: [sample.code] }}
          what={`The label of ${sample.code}.`}
          testID="sample-print-labels"
        />
        {canMove && panel === 'none' ? (
          <Button
            title={location ? 'Move' : 'Put away'}
            icon="enter-outline"
            variant="secondary"
            onPress={() => setPanel('move')}
            testID="sample-move"
          />
        ) : null}
        {canMove && location && panel === 'none' ? (
          <Button
            title="Take out"
            icon="exit-outline"
            variant="quiet"
            onPress={() => setPanel('take-out')}
            testID="sample-take-out"
          />
        ) : null}
      </View>
      {panel === 'move' ? (
        <MoveSamplePanel
          sampleCode={sample.code}
          current={location}
          onDone={() => setPanel('none')}
          onCancel={() => setPanel('none')}
        />
      ) : null}
      {panel === 'take-out' && location ? (
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

const styles = StyleSheet.create({
  top: { flexDirection: 'row', gap: space.xl, alignItems: 'flex-start' },
  topPhone: { flexDirection: 'column', gap: space.lg },
  facts: { flex: 1, minWidth: 0, gap: space.sm, alignSelf: 'stretch' },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm, alignItems: 'flex-start' },
});
