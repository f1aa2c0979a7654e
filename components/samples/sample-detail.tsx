import { Link } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { SAMPLE_KIND_LABELS } from '@/shared/samples';
import type { Sample } from '@/shared/schemas/sample';
import { STEP_TYPE_LABELS, STEP_TYPES } from '@/shared/steps';
import { RecordProvenanceSection } from '@/components/audit/record-provenance-section';
import { SampleLocationCard } from '@/components/boxes/sample-location-card';
import { EvidenceCard } from '@/components/evidence/evidence-card';
import { fontFaces, space } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { DetailRow } from '@/components/ui/detail-row';
import { formatDateTime } from '@/components/ui/format';
import { Notice } from '@/components/ui/notice';
import { ErrorState, LoadingState } from '@/components/ui/state-views';
import { Text } from '@/components/ui/text';
import { TextLink } from '@/components/ui/text-link';
import { describeError, isApiError } from '@/hooks/api-client';
import { useSampleQuery } from '@/hooks/use-samples';
import { useSessionQuery } from '@/hooks/use-session';
import { HistoryCard } from './history-card';
import { LineageCard } from './lineage-card';
import { ALL_PROPERTY_FIELDS, formatPropertyValue, PROPERTY_FIELDS } from './property-fields';
import { RetireSampleButton, RetireSamplePanel } from './retire-sample';
import { SampleChips } from './sample-chip';
import { SampleStatusPill } from './sample-status-pill';
import { canRetireSamples, canWriteSamples } from './writers-only';

/** Samples in these states cannot be used in a step (the server refuses them too). */
const USABLE = new Set<Sample['status']>(['ready', 'in_process']);

/** One sample: what it is, where it came from, what was made from it, and everything that happened to it. */
export function SampleDetail({ code }: { code: string }) {
  const sample = useSampleQuery(code);

  if (!sample.data) {
    if (isApiError(sample.error, 'not_found', 'code_typo')) {
      return (
        <Notice
          tone="warn"
          title={isApiError(sample.error, 'code_typo') ? 'That code has a typo' : `No sample has the code ${code}`}
          testID="sample-missing"
        >
          {isApiError(sample.error, 'code_typo')
            ? describeError(sample.error)
            : 'Check the code against the label, or search the list for the sample’s name.'}
        </Notice>
      );
    }
    return sample.isError ? (
      <ErrorState
        title={`Could not load ${code}`}
        error={sample.error}
        onRetry={() => void sample.refetch()}
        retrying={sample.isFetching}
      />
    ) : (
      <LoadingState label={`Loading ${code}…`} />
    );
  }

  const record = sample.data;
  return (
    <View style={styles.stack} testID="sample-detail">
      <IdentityCard sample={record} />
      <SampleLocationCard sample={record} />
      <PropertiesCard sample={record} />
      <OriginCard sample={record} />
      <EvidenceCard code={record.code} kind={record.kind} status={record.status} />
      <LineageCard code={record.code} direction="ancestors" />
      <LineageCard code={record.code} direction="descendants" />
      <RecordProvenanceSection sample={record} />
      <HistoryCard code={record.code} madeBy={record.madeBy} />
    </View>
  );
}

function IdentityCard({ sample }: { sample: Sample }) {
  const session = useSessionQuery();
  const canWrite = canWriteSamples(session.data) && sample.status !== 'retired';
  const canRetire = canRetireSamples(session.data) && sample.status !== 'retired';
  const [retiring, setRetiring] = useState(false);
  return (
    <Card testID="sample-identity">
      <View style={styles.identity}>
        <Text variant="title" style={styles.code} selectable testID="sample-code">
          {sample.code}
        </Text>
        <Text variant="label">{`${SAMPLE_KIND_LABELS[sample.kind]} · ${sample.material}`}</Text>
        {sample.name ? <Text variant="heading">{sample.name}</Text> : null}
        <SampleStatusPill status={sample.status} />
      </View>
      {sample.status === 'retired' ? (
        <Notice tone="warn" title="Retired" testID="sample-retired">
          {sample.retiredReason ?? 'Withdrawn by a lab manager.'}
        </Notice>
      ) : null}
      <View style={styles.facts}>
        <DetailRow label="Owner">{sample.owner.displayName}</DetailRow>
        <DetailRow label="Registered">{formatDateTime(sample.createdAt)}</DetailRow>
        <DetailRow label="Last changed">{formatDateTime(sample.updatedAt)}</DetailRow>
      </View>
      {sample.note ? <DetailRow label="Note">{sample.note}</DetailRow> : null}
      {canWrite || canRetire ? (
        <View style={styles.actions}>
          {canWrite ? (
            <Link href={{ pathname: '/samples/[code]/edit', params: { code: sample.code } }} asChild>
              <Button title="Edit" icon="create-outline" variant="secondary" testID="sample-edit" />
            </Link>
          ) : null}
          {canWrite && USABLE.has(sample.status) ? (
            <Link href={{ pathname: '/steps/new', params: { input: sample.code } }} asChild>
              <Button title="Log a step from this sample" icon="git-merge-outline" testID="sample-log-step" />
            </Link>
          ) : null}
          {canRetire && !retiring ? <RetireSampleButton onPress={() => setRetiring(true)} /> : null}
        </View>
      ) : null}
      {canRetire && retiring ? <RetireSamplePanel sample={sample} onClose={() => setRetiring(false)} /> : null}
    </Card>
  );
}

/** The kind's own facts (with a dash where nothing is recorded) and any others kept from earlier. */
function PropertiesCard({ sample }: { sample: Sample }) {
  const own = PROPERTY_FIELDS[sample.kind];
  const recorded = sample.properties as Record<string, unknown>;
  const others = ALL_PROPERTY_FIELDS.filter((field) => !own.includes(field) && recorded[field.name] !== undefined);
  const fields = [...own, ...others];
  if (fields.length === 0) return null;
  return (
    <Card title="Properties" testID="sample-properties">
      <View style={styles.facts}>
        {fields.map((field) => (
          <DetailRow key={field.name} label={field.label} testID={`sample-property-${field.name}`}>
            {formatPropertyValue(field, recorded[field.name])}
          </DetailRow>
        ))}
      </View>
    </Card>
  );
}

function stepTypeLabel(type: string): string {
  const known = STEP_TYPES.find((candidate) => candidate === type);
  return known ? STEP_TYPE_LABELS[known] : type;
}

function OriginCard({ sample }: { sample: Sample }) {
  const { madeBy } = sample;
  return (
    <Card title="Made by, parents and children" testID="sample-origin">
      <DetailRow label="Made by" testID="sample-made-by">
        {madeBy ? (
          <TextLink href={{ pathname: '/steps/[id]', params: { id: String(madeBy.stepId) } }} testID="sample-made-by-link">
            {`${stepTypeLabel(madeBy.type)}${madeBy.startedAt ? ` · ${formatDateTime(madeBy.startedAt)}` : ''} (step ${madeBy.stepId})`}
          </TextLink>
        ) : (
          <Text>Registered directly, not made by a logged step</Text>
        )}
      </DetailRow>
      <DetailRow label="Parents">
        <SampleChips samples={sample.parents} empty="None" testID="sample-parents" />
      </DetailRow>
      <DetailRow label="Children">
        <SampleChips samples={sample.children} empty="None yet" testID="sample-children" />
      </DetailRow>
    </Card>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.lg },
  identity: { gap: space.xs },
  code: { fontFamily: fontFaces.monoMedium },
  facts: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.xl, rowGap: space.md },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm, alignItems: 'flex-start' },
});
