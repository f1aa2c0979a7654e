import { StyleSheet, View } from 'react-native';
import { EVIDENCE_KIND_LABELS, type Evidence } from '@/shared/schemas/evidence';
import { SampleChip } from '@/components/samples/sample-chip';
import { canWriteSamples } from '@/components/samples/writers-only';
import { space } from '@/components/theme';
import { Card } from '@/components/ui/card';
import { DetailRow } from '@/components/ui/detail-row';
import { formatDateTime } from '@/components/ui/format';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { ErrorState, LoadingState } from '@/components/ui/state-views';
import { Text } from '@/components/ui/text';
import { isApiError } from '@/hooks/api-client';
import { useEvidenceQuery } from '@/hooks/use-evidence';
import { useSessionQuery } from '@/hooks/use-session';
import { AfmEvidence } from './afm-evidence';
import { estimateSentence } from './layer-words';
import { MicrographEvidence } from './micrograph-evidence';
import { formatNumber } from './number-text';
import { formatBytes } from './picked-file';
import { SpectrumEvidence } from './spectrum-evidence';
import { substrateWords } from './substrate-words';

export interface EvidenceScreenProps {
  id: number | null;
  /** Straight after the upload: say it was stored. */
  justAdded: boolean;
}

/** One piece of evidence: its file, what was said about it, and what Flakeline computed from it. */
export function EvidenceScreen({ id, justAdded }: EvidenceScreenProps) {
  const evidence = useEvidenceQuery(id);
  const session = useSessionQuery();

  if (id === null || isApiError(evidence.error, 'not_found')) {
    return (
      <Screen title="Evidence" testID="evidence-screen">
        <Notice tone="warn" title="No such evidence" testID="evidence-missing">
          The link may be mistyped. Evidence is reached from the sample it belongs to.
        </Notice>
      </Screen>
    );
  }
  if (!evidence.data) {
    return (
      <Screen title="Evidence" testID="evidence-screen">
        {evidence.isError ? (
          <ErrorState
            title="Could not load the evidence"
            error={evidence.error}
            onRetry={() => void evidence.refetch()}
            retrying={evidence.isFetching}
          />
        ) : (
          <LoadingState label="Loading the evidence…" />
        )}
      </Screen>
    );
  }

  const record = evidence.data;
  const canWrite = canWriteSamples(session.data);
  return (
    <Screen
      title={EVIDENCE_KIND_LABELS[record.kind]}
      lead={record.sample ? `Evidence for ${record.sample.code}` : undefined}
      width={record.kind === 'micrograph' ? 'wide' : 'reading'}
      testID="evidence-screen"
    >
      {justAdded ? (
        <Notice tone="success" title="Evidence added" testID="evidence-added">
          {record.kind === 'micrograph'
            ? 'Stored and checked. Mark the flake and the substrate below to get a layer count.'
            : 'Stored, checked and analysed.'}
        </Notice>
      ) : null}
      <AboutCard evidence={record} />
      {record.kind === 'micrograph' ? <MicrographEvidence evidence={record} canWrite={canWrite} /> : null}
      {record.kind === 'raman' || record.kind === 'pl' ? <SpectrumEvidence evidence={record} /> : null}
      {record.kind === 'afm' ? <AfmEvidence evidence={record} /> : null}
    </Screen>
  );
}

/** What the researcher said, in words: the settings that decide how far the numbers can be trusted. */
function settingsOf(evidence: Evidence): [string, string][] {
  const rows: [string, string][] = [];
  switch (evidence.kind) {
    case 'micrograph': {
      const { metadata } = evidence;
      if (metadata.objectiveMagnification) rows.push(['Objective', `${formatNumber(metadata.objectiveMagnification)}×`]);
      rows.push(['Scale', metadata.umPerPixel ? `${formatNumber(metadata.umPerPixel, 4)} µm per pixel` : 'No calibration']);
      if (metadata.illumination) {
        rows.push([
          'Illumination',
          metadata.illumination.kind === 'white' ? 'White light' : `Band-pass filter at ${metadata.illumination.centreNm} nm`,
        ]);
      }
      if (metadata.exposureMs) rows.push(['Exposure', `${formatNumber(metadata.exposureMs)} ms`]);
      if (metadata.substrate) rows.push(['Substrate', substrateWords(metadata.substrate)]);
      break;
    }
    case 'raman':
      if (evidence.metadata.laserNm) rows.push(['Laser', `${evidence.metadata.laserNm} nm`]);
      break;
    case 'pl':
      if (evidence.metadata.laserNm) rows.push(['Laser', `${evidence.metadata.laserNm} nm`]);
      rows.push(['First column', evidence.metadata.xUnit === 'eV' ? 'Energy (eV)' : 'Wavelength (nm)']);
      if (evidence.metadata.referenceIntensity)
        rows.push(['Reference intensity', formatNumber(evidence.metadata.referenceIntensity)]);
      break;
    case 'afm':
      if (evidence.metadata.offsetNm !== undefined) rows.push(['Offset', `${formatNumber(evidence.metadata.offsetNm)} nm`]);
      break;
  }
  return rows;
}

function AboutCard({ evidence }: { evidence: Evidence }) {
  const { file } = evidence;
  const fileFacts = [
    formatBytes(file.byteSize),
    file.widthPx && file.heightPx ? `${file.widthPx} × ${file.heightPx} px` : null,
    file.mediaType,
  ].filter(Boolean);
  return (
    <Card testID="evidence-about">
      <View style={styles.facts}>
        {evidence.sample ? (
          <DetailRow label="Sample">
            <SampleChip sample={evidence.sample} />
          </DetailRow>
        ) : null}
        <DetailRow label="Layer count" testID="evidence-estimate">
          {evidence.estimate ? estimateSentence(evidence.estimate) : 'None yet'}
        </DetailRow>
        <DetailRow label="Added">
          {`${formatDateTime(evidence.createdAt)}${evidence.createdBy ? ` by ${evidence.createdBy.displayName}` : ''}`}
        </DetailRow>
        {settingsOf(evidence).map(([label, value]) => (
          <DetailRow key={label} label={label}>
            {value}
          </DetailRow>
        ))}
      </View>
      <DetailRow label="File">
        <Text selectable>{evidence.originalName ?? 'Unnamed upload'}</Text>
        <Text variant="caption" tone="muted" selectable>
          {`${fileFacts.join(' · ')} · SHA-256 ${file.sha256.slice(0, 16)}…`}
        </Text>
      </DetailRow>
      {evidence.metadata.note ? <DetailRow label="Note">{evidence.metadata.note}</DetailRow> : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  facts: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.xl, rowGap: space.md },
});
