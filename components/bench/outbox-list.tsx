import { useRouter } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { Text } from '@/components/ui/text';
import { useStepOutbox, type OutboxItem } from '@/hooks/use-step-outbox';

const STATE_WORDS: Record<OutboxItem['state'], string> = {
  waiting: 'Waiting to sync',
  sending: 'Sending…',
  refused: 'Not accepted by the server',
};

function editPath(item: OutboxItem): string {
  const form = item.body.type === 'cvd_growth' ? 'growth' : 'exfoliation';
  return `/bench/${form}?outbox=${encodeURIComponent(item.key)}`;
}

/**
 * Runs logged while the server could not be reached, and runs it refused. Nothing leaves this
 * list without being sent or discarded by the person.
 */
export function OutboxList() {
  const router = useRouter();
  const { colors } = useTheme();
  const outbox = useStepOutbox();
  if (outbox.items.length === 0 && outbox.synced.length === 0) return null;
  const waiting = outbox.items.filter((item) => item.state !== 'refused').length;

  return (
    <Card
      title="Waiting to sync"
      lead={
        outbox.items.length
          ? 'Kept on this device and sent as soon as the Flakeline server answers. Sending again never logs a run twice.'
          : 'Everything logged on this device has reached the server.'
      }
      testID="bench-outbox"
    >
      {!outbox.persisted ? (
        <Notice tone="warn" title="This browser is not keeping them">
          Storage is switched off here, so waiting runs are lost if this page is closed. Keep it open until they sync.
        </Notice>
      ) : null}
      {outbox.items.map((item) => (
        <View
          key={item.key}
          style={[styles.item, { borderColor: item.state === 'refused' ? colors.danger : colors.outline }]}
          testID={`outbox-item-${item.state}`}
        >
          <Text variant="label">{item.summary}</Text>
          <Text variant="caption" tone={item.state === 'refused' ? 'danger' : 'muted'} testID="outbox-item-state">
            {`${STATE_WORDS[item.state]} · logged ${new Date(item.createdAt).toLocaleString()}`}
          </Text>
          {item.problem ? (
            <Notice tone="error" title="The server said">
              {item.problem.message || 'It refused this run.'}
              {Object.values(item.problem.fields).flat().join(' ')}
            </Notice>
          ) : null}
          {item.state === 'refused' ? (
            <View style={styles.actions}>
              <Button
                title="Edit and send"
                icon="create-outline"
                onPress={() => router.push(editPath(item))}
                testID="outbox-edit"
              />
              <Button
                title="Discard"
                variant="quiet"
                icon="trash-outline"
                onPress={() => outbox.discard(item.key)}
                testID="outbox-discard"
              />
            </View>
          ) : null}
        </View>
      ))}
      {waiting ? (
        <Button
          title="Sync now"
          icon="sync"
          variant="secondary"
          loading={outbox.syncing}
          onPress={() => void outbox.syncNow()}
          testID="outbox-sync"
        />
      ) : null}
      {outbox.synced.map((run) => (
        <Text key={run.key} variant="caption" tone="muted" testID="outbox-synced">
          {`Synced: ${run.summary} (step ${run.stepId})`}
        </Text>
      ))}
    </Card>
  );
}

const styles = StyleSheet.create({
  item: { borderWidth: sizes.hairline, borderRadius: radii.md, padding: space.md, gap: space.xs },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
