import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { AuditReport } from '@/shared/schemas/audit';
import { fontFaces, space } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { DetailRow } from '@/components/ui/detail-row';
import { formatDateTime } from '@/components/ui/format';
import { Notice } from '@/components/ui/notice';
import { Text } from '@/components/ui/text';

const short = (hash: string) => `${hash.slice(0, 12)}…`;

/** The files re-hashed and the history chain recomputed for this audit, with the events it covers. */
export function AuditChecks({ audit }: { audit: AuditReport }) {
  const [showEvents, setShowEvents] = useState(false);
  const { files, chain } = audit;
  return (
    <Card title="Checks made now" lead="Recomputed while this audit was made, not copied from earlier." testID="audit-checks">
      {files.checked === 0 ? (
        <Notice tone="info" title="No evidence files to check" testID="audit-file-checks">
          None of these records has an uploaded file yet.
        </Notice>
      ) : (
        <Notice
          tone={files.missing + files.altered === 0 ? 'success' : 'error'}
          title={`Files: ${files.intact} of ${files.checked} intact`}
          testID="audit-file-checks"
        >
          {files.missing + files.altered === 0
            ? 'Every stored file still hashes to the checksum recorded when it was uploaded.'
            : `${files.missing} missing and ${files.altered} altered since upload.`}
        </Notice>
      )}
      <Notice
        tone={chain.intact ? 'success' : 'error'}
        title={chain.intact ? `History chain intact (${chain.checked} events)` : 'History chain broken'}
        testID="audit-chain"
      >
        {chain.intact
          ? 'Each event’s hash was recomputed from its content and the hash before it; none was changed.'
          : `The first altered link is event ${chain.firstBroken?.eventId ?? '?'}: ${chain.firstBroken?.reason ?? 'its hash does not match'}.`}
      </Notice>
      {chain.headHash ? (
        <DetailRow label="Chain head hash">
          <Text variant="code" selectable style={styles.hash} testID="audit-head-hash">
            {chain.headHash}
          </Text>
        </DetailRow>
      ) : null}
      <Button
        title={showEvents ? 'Hide the events' : `Show ${audit.events.length} history events`}
        accessibilityLabel={
          showEvents ? 'Hide the history events' : `Show the ${audit.events.length} history events of these records`
        }
        variant="quiet"
        icon={showEvents ? 'chevron-up' : 'chevron-down'}
        onPress={() => setShowEvents((shown) => !shown)}
        testID="audit-show-events"
      />
      {showEvents ? (
        <View style={styles.events} testID="audit-events">
          {audit.events.map((event) => (
            <Text key={event.id} variant="caption">
              {`${formatDateTime(event.occurredAt)} · ${event.type}${event.subjectCode ? ` · ${event.subjectCode}` : ''}${event.actor ? ` · ${event.actor.displayName}` : ''} · `}
              <Text variant="caption" style={styles.hashInline} selectable>
                {short(event.hash)}
              </Text>
            </Text>
          ))}
        </View>
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  hash: { flexShrink: 1 },
  hashInline: { fontFamily: fontFaces.monoMedium },
  events: { gap: space.xs },
});
