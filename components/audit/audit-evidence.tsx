import { Image, StyleSheet, View } from 'react-native';
import type { AuditEvidence, AuditReport, FileCheckResult } from '@/shared/schemas/audit';
import { EVIDENCE_KIND_LABELS } from '@/shared/schemas/evidence';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { DotPill, type PillLook } from '@/components/ui/badges';
import { Card } from '@/components/ui/card';
import { formatDateTime } from '@/components/ui/format';
import { Text } from '@/components/ui/text';
import { thumbnailPath } from '@/hooks/use-audit';
import { RecordRef, StepRef, type AuditReach } from './audit-refs';

/** Micrograph previews at a size that shows a flake's outline on a phone (common practice, no source). */
const THUMBNAIL_PX = 96;

const CHECK_WORDS: Record<FileCheckResult, string> = { intact: 'File intact', missing: 'File missing', altered: 'File altered' };
const CHECK_LOOKS: Record<FileCheckResult, PillLook> = {
  intact: { background: 'successSoft', text: 'onSuccessSoft', dot: 'onSuccessSoft' },
  missing: { background: 'warnSoft', text: 'onWarnSoft', dot: 'onWarnSoft' },
  altered: { background: 'dangerSoft', text: 'onDangerSoft', dot: 'onDangerSoft' },
};

function layerWords(item: AuditEvidence): string {
  if (item.layerCount === null) return 'No layer call';
  const count = `${item.layerCount} ${item.layerCount === 1 ? 'layer' : 'layers'}`;
  const spread = item.layerUncertainty ? ` ± ${item.layerUncertainty}` : '';
  return `${count}${spread}${item.layerMethod ? ` by ${item.layerMethod}` : ''}`;
}

/** Thickness evidence in the ancestry, each with its layer call, method and its file checked now. */
export function AuditEvidenceList({ audit, reach }: { audit: AuditReport; reach: AuditReach }) {
  return (
    <Card
      title="Evidence"
      lead="Micrographs, spectra and height profiles behind each layer call; every file's checksum was recomputed for this audit."
      testID="audit-evidence"
    >
      {audit.evidence.length === 0 ? <Text tone="muted">No thickness evidence is attached to these records.</Text> : null}
      {audit.evidence.map((item) => (
        <EvidenceRow key={item.id} item={item} reach={reach} />
      ))}
    </Card>
  );
}

function EvidenceRow({ item, reach }: { item: AuditEvidence; reach: AuditReach }) {
  const { colors } = useTheme();
  // Previews are served to people signed in to the lab; a shared reader finds them in the PDF.
  const preview = reach === 'lab' && item.kind === 'micrograph' && item.file.thumbnailSha256 && item.file.check === 'intact';
  return (
    <View style={[styles.row, { borderColor: colors.hairline }]} testID={`audit-evidence-${item.id}`}>
      {preview ? (
        <Image
          source={{ uri: thumbnailPath(item.file.sha256) }}
          style={[styles.thumbnail, { backgroundColor: colors.sunken }]}
          accessibilityLabel={`Micrograph${item.originalName ? ` ${item.originalName}` : ''}`}
          testID={`audit-thumbnail-${item.id}`}
        />
      ) : null}
      <View style={styles.text}>
        <Text variant="label">{`${EVIDENCE_KIND_LABELS[item.kind]}${item.originalName ? ` · ${item.originalName}` : ''}`}</Text>
        <Text>{layerWords(item)}</Text>
        <View style={styles.refs}>
          {item.sampleCode ? <RecordRef code={item.sampleCode} reach={reach} /> : null}
          {item.stepId !== null ? <StepRef id={item.stepId} label={`Step ${item.stepId}`} reach={reach} /> : null}
        </View>
        <DotPill
          label={CHECK_WORDS[item.file.check]}
          look={CHECK_LOOKS[item.file.check]}
          testID={`audit-file-${item.file.check}`}
        />
        <Text variant="caption" tone="muted" selectable>
          {`SHA-256 ${item.file.sha256}`}
        </Text>
        <Text variant="caption" tone="muted">
          {[item.createdBy?.displayName, formatDateTime(item.createdAt)].filter(Boolean).join(' · ')}
        </Text>
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  row: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    gap: space.md,
    borderWidth: sizes.hairline,
    borderRadius: radii.md,
    padding: space.md,
  },
  thumbnail: { width: THUMBNAIL_PX, height: THUMBNAIL_PX, borderRadius: radii.sm },
  text: { flex: 1, minWidth: 200, gap: space.xxs },
  refs: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.lg },
});
