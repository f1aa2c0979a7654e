import { StyleSheet, View } from 'react-native';
import { AUDIT_GAP_LABELS, type AuditGap, type AuditReport } from '@/shared/schemas/audit';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { formatDateTime } from '@/components/ui/format';
import { Notice } from '@/components/ui/notice';
import { Heading, Text } from '@/components/ui/text';
import type { AuditExports } from '@/hooks/use-audit';
import { RecordRef, StepRef, type AuditReach } from './audit-refs';
import { DownloadButton } from './download-button';

/** The answer first: is this record ready to be published on, and if not, what stands in the way. */
export function AuditVerdict({ audit, exports, reach }: { audit: AuditReport; exports: AuditExports; reach: AuditReach }) {
  const { colors } = useTheme();
  const ready = audit.verdict === 'ready';
  const count = audit.gaps.length;
  return (
    <View
      style={[styles.card, { backgroundColor: colors.surface, borderColor: ready ? colors.onSuccessSoft : colors.onWarnSoft }]}
      testID="audit-verdict"
    >
      <Notice
        tone={ready ? 'success' : 'warn'}
        title={ready ? 'Ready for publication' : `Not ready: ${count} ${count === 1 ? 'gap' : 'gaps'} to close`}
        testID={`audit-verdict-${audit.verdict}`}
      >
        {ready
          ? 'Every ancestor, step, piece of evidence and file checked out, and the history chain is intact.'
          : 'Each gap below names the record or step it concerns. Fix it in the record, or explain it in the paper.'}
      </Notice>
      <Text
        variant="caption"
        tone="muted"
      >{`Checked ${formatDateTime(audit.generatedAt)}: ${audit.records.length} records, ${audit.steps.length} steps, ${audit.evidence.length} pieces of evidence, and the lab's history chain of ${audit.chain.checked} events.`}</Text>
      {count > 0 ? (
        <View style={styles.gaps} role="list" accessibilityLabel="Gaps" testID="audit-gaps">
          {audit.gaps.map((gap, index) => (
            <GapRow key={`${gap.kind}-${index}`} gap={gap} reach={reach} />
          ))}
        </View>
      ) : null}
      <View style={styles.actions}>
        <DownloadButton
          href={exports.pdf}
          fileName={exports.pdfName}
          title="Download PDF"
          icon="document-text-outline"
          variant="primary"
          testID="audit-download-pdf"
        />
        <DownloadButton
          href={exports.jsonLd}
          fileName={exports.jsonLdName}
          title="Download PROV JSON-LD"
          icon="code-download-outline"
          testID="audit-download-jsonld"
        />
      </View>
    </View>
  );
}

function GapRow({ gap, reach }: { gap: AuditGap; reach: AuditReach }) {
  const { colors } = useTheme();
  return (
    <View role="listitem" style={[styles.gap, { borderLeftColor: colors.onWarnSoft }]} testID={`audit-gap-${gap.kind}`}>
      <Heading level={3}>{AUDIT_GAP_LABELS[gap.kind]}</Heading>
      <Text>{gap.message}</Text>
      <View style={styles.refs}>
        {gap.sampleCode ? <RecordRef code={gap.sampleCode} reach={reach} /> : null}
        {gap.stepId !== null ? <StepRef id={gap.stepId} label={`Step ${gap.stepId}`} reach={reach} /> : null}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  card: { borderRadius: radii.lg, borderWidth: sizes.focusRing - 1, padding: space.lg, gap: space.md },
  gaps: { gap: space.md },
  gap: { borderLeftWidth: sizes.focusRing, paddingLeft: space.md, gap: space.xxs },
  refs: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.lg },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
