import { StyleSheet, View } from 'react-native';
import { SAMPLE_KIND_LABELS } from '@/shared/samples';
import type { AuditReport } from '@/shared/schemas/audit';
import { formatLengthUm, formatNumber } from '@/shared/zone-plate';
import { formatFineLength } from '@/components/devices/lens-figures';
import { space } from '@/components/theme';
import { Card } from '@/components/ui/card';
import { DetailRow } from '@/components/ui/detail-row';
import { formatDateTime } from '@/components/ui/format';
import type { AuditExports } from '@/hooks/use-audit';
import { AuditAncestry } from './audit-ancestry';
import { AuditChecks } from './audit-checks';
import { AuditEvidenceList } from './audit-evidence';
import type { AuditReach } from './audit-refs';
import { AuditSteps } from './audit-steps';
import { AuditVerdict } from './audit-verdict';

export interface AuditReportViewProps {
  audit: AuditReport;
  exports: AuditExports;
  reach: AuditReach;
}

/** The whole audit, read top to bottom on a phone: verdict and gaps, the record, ancestry, steps, evidence, checks. */
export function AuditReportView({ audit, exports, reach }: AuditReportViewProps) {
  const { subject, lensDesign } = audit;
  return (
    <View style={styles.stack} testID="audit-report">
      <AuditVerdict audit={audit} exports={exports} reach={reach} />
      <Card
        title={subject.code}
        lead={`${SAMPLE_KIND_LABELS[subject.kind]} · ${subject.material}${subject.name ? ` · ${subject.name}` : ''}`}
        testID="audit-subject"
      >
        <View style={styles.facts}>
          <DetailRow label="Owner">{subject.owner.displayName}</DetailRow>
          <DetailRow label="Registered">{formatDateTime(subject.createdAt)}</DetailRow>
          {lensDesign ? (
            <>
              <DetailRow label="Lens design">{`${formatNumber(lensDesign.wavelengthNm)} nm, f = ${formatLengthUm(lensDesign.focalLengthUm)}`}</DetailRow>
              <DetailRow label="Zones">{`${lensDesign.zoneCount}, ${formatLengthUm(lensDesign.lensDiameterUm)} across`}</DetailRow>
              <DetailRow label="Outermost zone">{formatFineLength(lensDesign.outermostZoneWidthUm)}</DetailRow>
            </>
          ) : null}
        </View>
      </Card>
      <AuditAncestry audit={audit} reach={reach} />
      <AuditSteps audit={audit} reach={reach} />
      <AuditEvidenceList audit={audit} reach={reach} />
      <AuditChecks audit={audit} />
    </View>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.lg },
  facts: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.xl, rowGap: space.md },
});
