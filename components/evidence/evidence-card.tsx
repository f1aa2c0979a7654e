import Ionicons from '@expo/vector-icons/Ionicons';
import { Link } from 'expo-router';
import { Image, Pressable, StyleSheet, View } from 'react-native';
import type { SampleKind, SampleStatus } from '@/shared/samples';
import type { Evidence } from '@/shared/schemas/evidence';
import type { LayerCall } from '@/shared/schemas/evidence-analysis';
import { canWriteSamples } from '@/components/samples/writers-only';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { DotPill } from '@/components/ui/badges';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { formatDate } from '@/components/ui/format';
import { ErrorState, LoadingState } from '@/components/ui/state-views';
import { Text } from '@/components/ui/text';
import { TextLink } from '@/components/ui/text-link';
import { useSampleEvidenceQuery } from '@/hooks/use-evidence';
import { useSessionQuery } from '@/hooks/use-session';
import { formatNumber } from './number-text';
import { CALL_STATUS, callFigure, describeEstimate, estimateSentence, KIND_ICONS, KIND_SHORT_LABELS } from './layer-words';

/** Kinds a layer count means something for; a source crystal or a precursor lot is bulk. */
const THIN_KINDS: readonly SampleKind[] = ['chip', 'flake', 'film', 'stack', 'device'];
const CLOSED: readonly SampleStatus[] = ['retired', 'discarded'];

export interface EvidenceCardProps {
  code: string;
  kind: SampleKind;
  status: SampleStatus;
}

/** A sample's thickness evidence: the one layer call, the evidence behind it, and a way to add more. */
export function EvidenceCard({ code, kind, status }: EvidenceCardProps) {
  const session = useSessionQuery();
  const evidence = useSampleEvidenceQuery(THIN_KINDS.includes(kind) ? code : '');
  if (!THIN_KINDS.includes(kind)) return null;
  const canAdd = canWriteSamples(session.data) && !CLOSED.includes(status);

  return (
    <Card title="Thickness evidence" testID="evidence-card">
      {evidence.data ? (
        <>
          <LayerCallSummary call={evidence.data.layerCall} />
          {evidence.data.evidence.length ? (
            <View style={styles.list} testID="evidence-list">
              {evidence.data.evidence.map((item) => (
                <EvidenceRow key={item.id} evidence={item} />
              ))}
            </View>
          ) : (
            <Text tone="muted">
              {kind === 'chip'
                ? 'Add a micrograph of the chip to have Flakeline look for monolayer candidates.'
                : 'Add a micrograph, a Raman or PL spectrum, or an AFM profile to back a layer count.'}
            </Text>
          )}
        </>
      ) : evidence.isError ? (
        <ErrorState
          title="Could not load the evidence"
          error={evidence.error}
          onRetry={() => void evidence.refetch()}
          retrying={evidence.isFetching}
        />
      ) : (
        <LoadingState label="Loading evidence…" />
      )}
      <View style={styles.actions}>
        {canAdd ? (
          <Link href={{ pathname: '/evidence/new', params: { sample: code } }} asChild>
            <Button title="Add evidence" icon="add" testID="evidence-add" />
          </Link>
        ) : null}
        <TextLink href="/planning" testID="evidence-planning-link">
          Contrast planning
        </TextLink>
        <TextLink href="/calibrations" testID="evidence-calibrations-link">
          Microscope calibrations
        </TextLink>
      </View>
    </Card>
  );
}

export function LayerCallSummary({ call }: { call: LayerCall }) {
  const { colors } = useTheme();
  const status = CALL_STATUS[call.status];
  const figure = callFigure(call);
  return (
    <View style={[styles.call, { backgroundColor: colors.sunken }]} testID="layer-call">
      <View style={styles.figure}>
        <Text variant="display" testID="layer-call-layers" accessibilityLabel={`Layer call: ${figure === '–' ? 'none' : figure}`}>
          {figure}
        </Text>
        <Text variant="caption" tone="muted">
          {call.layers === 1 ? 'layer' : 'layers'}
          {call.uncertainty ? ` ± ${formatNumber(call.uncertainty, 2)}` : ''}
        </Text>
      </View>
      <View style={styles.callText}>
        <DotPill label={status.label} look={status.look} testID={`layer-call-status-${call.status}`} />
        <Text testID="layer-call-summary">{call.summary}</Text>
      </View>
    </View>
  );
}

function EvidenceRow({ evidence }: { evidence: Evidence }) {
  const { colors } = useTheme();
  const estimate = evidence.estimate;
  const pending =
    evidence.kind === 'micrograph' && !evidence.analysis.contrast
      ? 'Mark the flake and substrate to get a count'
      : 'No layer count';
  return (
    <Link href={{ pathname: '/evidence/[id]', params: { id: String(evidence.id) } }} asChild>
      <Pressable
        accessibilityRole="link"
        accessibilityLabel={`${KIND_SHORT_LABELS[evidence.kind]}: ${estimate ? describeEstimate(estimate) : pending}`}
        testID={`evidence-row-${evidence.id}`}
        style={styles.target}
      >
        {/* A link passes its own props to the pressable, so the pressed look lives on an inner view. */}
        {({ pressed }) => (
          <View style={[styles.row, { borderColor: colors.hairline, backgroundColor: pressed ? colors.sunken : 'transparent' }]}>
            {evidence.file.thumbnailUrl ? (
              <Image source={{ uri: evidence.file.thumbnailUrl }} style={[styles.thumb, { backgroundColor: colors.sunken }]} />
            ) : (
              <View style={[styles.thumb, styles.icon, { backgroundColor: colors.primarySoft }]}>
                <Ionicons name={KIND_ICONS[evidence.kind]} size={sizes.icon} color={colors.onPrimarySoft} />
              </View>
            )}
            <View style={styles.rowText}>
              <Text variant="label">{KIND_SHORT_LABELS[evidence.kind]}</Text>
              <Text variant="caption" tone={estimate ? 'default' : 'muted'}>
                {estimate ? estimateSentence(estimate) : pending}
              </Text>
              <Text variant="caption" tone="muted" numberOfLines={1}>
                {[formatDate(evidence.createdAt), evidence.createdBy?.displayName, evidence.originalName]
                  .filter(Boolean)
                  .join(' · ')}
              </Text>
            </View>
            <Ionicons name="chevron-forward" size={sizes.iconSmall} color={colors.inkMuted} />
          </View>
        )}
      </Pressable>
    </Link>
  );
}

const THUMB = sizes.touchTarget + space.md;

const styles = StyleSheet.create({
  call: { flexDirection: 'row', alignItems: 'center', gap: space.lg, padding: space.lg, borderRadius: radii.md },
  figure: { alignItems: 'center', minWidth: sizes.touchTarget + space.lg },
  callText: { flex: 1, gap: space.sm },
  list: { gap: space.xs },
  target: { alignSelf: 'stretch' },
  row: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    minHeight: sizes.touchTarget,
    paddingVertical: space.sm,
    paddingHorizontal: space.xs,
    borderTopWidth: sizes.hairline,
  },
  thumb: { width: THUMB, height: THUMB, borderRadius: radii.sm },
  icon: { alignItems: 'center', justifyContent: 'center' },
  rowText: { flex: 1, gap: space.xxs },
  actions: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', columnGap: space.lg, rowGap: space.xs },
});
