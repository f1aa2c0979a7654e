import Ionicons from '@expo/vector-icons/Ionicons';
import { StyleSheet, View } from 'react-native';
import type { HistoryEvent } from '@/shared/schemas/history';
import type { Sample } from '@/shared/schemas/sample';
import { sizes, space, useTheme } from '@/components/theme';
import { Card } from '@/components/ui/card';
import { formatDateTime } from '@/components/ui/format';
import { Text } from '@/components/ui/text';
import { TextLink } from '@/components/ui/text-link';
import { useSampleHistoryQuery } from '@/hooks/use-samples';
import { describeEvent } from './history-events';
import { SectionStatus } from './section-status';

/** Everything that happened to a sample, newest first: what, who and when. The log is append-only. */
export function HistoryCard({ code, madeBy }: { code: string; madeBy: Sample['madeBy'] }) {
  const history = useSampleHistoryQuery(code);
  return (
    <Card title="History" lead="Newest first. Entries are never changed or removed." testID="history">
      {!history.data ? (
        <SectionStatus query={history} what="the history" />
      ) : history.data.length === 0 ? (
        <Text tone="muted">Nothing recorded yet.</Text>
      ) : (
        <View role="list" accessibilityLabel="History" style={styles.list}>
          {history.data.map((event, index) => (
            <HistoryItem
              key={event.id}
              event={event}
              madeByType={madeBy?.stepId === event.stepId ? madeBy?.type : undefined}
              last={index === history.data.length - 1}
            />
          ))}
        </View>
      )}
    </Card>
  );
}

function HistoryItem({ event, madeByType, last }: { event: HistoryEvent; madeByType?: string; last: boolean }) {
  const { colors } = useTheme();
  const described = describeEvent(event, madeByType);
  return (
    <View role="listitem" style={styles.item} testID={`history-event-${event.id}`}>
      <View style={styles.rail}>
        <View style={[styles.iconWell, { backgroundColor: colors.primarySoft }]}>
          <Ionicons name={described.icon} size={sizes.iconSmall} color={colors.onPrimarySoft} />
        </View>
        {last ? null : <View style={[styles.line, { backgroundColor: colors.hairline }]} />}
      </View>
      <View style={styles.body}>
        <Text variant="label">{described.title}</Text>
        {described.lines.map((line) => (
          <Text key={line} selectable>
            {line}
          </Text>
        ))}
        <Text variant="caption" tone="muted">
          {`${event.actor?.displayName ?? 'Flakeline'} · ${formatDateTime(event.occurredAt)}`}
        </Text>
        {event.stepId ? (
          <TextLink href={{ pathname: '/steps/[id]', params: { id: String(event.stepId) } }} testID={`history-step-${event.id}`}>
            {`Open step ${event.stepId}`}
          </TextLink>
        ) : null}
      </View>
    </View>
  );
}

const ICON_WELL = sizes.iconSmall + space.md;

const styles = StyleSheet.create({
  list: { gap: 0 },
  item: { flexDirection: 'row', gap: space.md },
  rail: { alignItems: 'center', width: ICON_WELL },
  iconWell: { width: ICON_WELL, height: ICON_WELL, borderRadius: ICON_WELL / 2, alignItems: 'center', justifyContent: 'center' },
  line: { flex: 1, width: sizes.hairline * 2, marginVertical: space.xs },
  body: { flex: 1, gap: space.xxs, paddingBottom: space.lg, minWidth: 0 },
});
