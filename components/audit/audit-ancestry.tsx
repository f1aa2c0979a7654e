import { StyleSheet, View } from 'react-native';
import { SAMPLE_KIND_LABELS } from '@/shared/samples';
import type { AuditRecord, AuditReport } from '@/shared/schemas/audit';
import { generationTitle, layerCall } from '@/components/lineage/lineage-words';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { Card } from '@/components/ui/card';
import { Heading, Text } from '@/components/ui/text';
import { RecordRef, type AuditReach } from './audit-refs';

function byGeneration(records: readonly AuditRecord[]): [number, AuditRecord[]][] {
  const groups = new Map<number, AuditRecord[]>();
  for (const record of records) groups.set(record.generation, [...(groups.get(record.generation) ?? []), record]);
  // The record itself first, then its parents, grandparents… back to the sources.
  return [...groups.entries()].sort(([a], [b]) => b - a);
}

/** Every ancestor once, generation by generation, back to each source crystal, lot or growth run. */
export function AuditAncestry({ audit, reach }: { audit: AuditReport; reach: AuditReach }) {
  const sources = audit.records.filter((record) => record.isSource).length;
  return (
    <Card
      title="Ancestry"
      lead={`${audit.records.length - 1} ancestors back to ${sources} ${sources === 1 ? 'source' : 'sources'}, nearest first.`}
      testID="audit-ancestry"
    >
      {byGeneration(audit.records).map(([generation, records]) => (
        <View key={generation} style={styles.generation} testID={`audit-generation-${generation}`}>
          <Heading level={3}>{generationTitle(generation)}</Heading>
          {records.map((record) => (
            <RecordRow key={record.code} record={record} reach={reach} />
          ))}
        </View>
      ))}
    </Card>
  );
}

function RecordRow({ record, reach }: { record: AuditRecord; reach: AuditReach }) {
  const { colors } = useTheme();
  const layers = layerCall(record);
  const facts = [`${SAMPLE_KIND_LABELS[record.kind]} · ${record.material}`, layers, record.isSource ? 'source' : null]
    .filter(Boolean)
    .join(' · ');
  return (
    <View style={[styles.row, { borderColor: colors.hairline }]} testID={`audit-record-${record.code}`}>
      <RecordRef code={record.code} reach={reach} />
      {record.name ? <Text variant="label">{record.name}</Text> : null}
      <Text variant="caption">{facts}</Text>
      <Text variant="caption" tone="muted">
        {record.parentCodes.length > 0
          ? `From ${record.parentCodes.join(', ')}`
          : record.isSource
            ? 'Registered as a source'
            : 'No parents recorded'}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  generation: { gap: space.sm },
  row: {
    borderWidth: sizes.hairline,
    borderRadius: radii.md,
    paddingHorizontal: space.md,
    paddingVertical: space.sm,
    gap: space.xxs,
  },
});
