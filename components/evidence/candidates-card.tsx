import { useRouter } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { Evidence } from '@/shared/schemas/evidence';
import type { LayerCandidate } from '@/shared/schemas/evidence-analysis';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { Card } from '@/components/ui/card';
import { FormProblem } from '@/components/ui/form-problem';
import { Text } from '@/components/ui/text';
import { TextLink } from '@/components/ui/text-link';
import { useCalibrationsQuery } from '@/hooks/use-calibrations';
import { useFindCandidatesMutation, useMakeFlakeMutation, useUpdateEvidenceMutation } from '@/hooks/use-evidence';
import { layersWord } from './layer-words';
import { formatNumber } from './number-text';
import { MARKER_COLOURS } from './plot-colors';

type Micrograph = Extract<Evidence, { kind: 'micrograph' }>;

export interface CandidatesCardProps {
  evidence: Micrograph;
  canWrite: boolean;
  selected: number | null;
  onSelect: (index: number) => void;
}

/**
 * Regions of the image whose contrast falls in the predicted window for one or two layers, as
 * outlines on the micrograph and as a list; on a chip each can become a flake record.
 */
export function CandidatesCard({ evidence, canWrite, selected, onSelect }: CandidatesCardProps) {
  const router = useRouter();
  const find = useFindCandidatesMutation();
  const makeFlake = useMakeFlakeMutation();
  const analysis = evidence.analysis.candidates;
  const onChip = evidence.sample?.kind === 'chip';
  const umPerPixel = analysis?.umPerPixel ?? evidence.metadata.umPerPixel ?? null;

  const make = (index: number) =>
    makeFlake.mutate(
      { id: evidence.id, index },
      { onSuccess: (result) => router.push({ pathname: '/samples/[code]', params: { code: result.sample.code } }) },
    );

  return (
    <Card
      title="Monolayer candidates"
      lead="Areas whose colour matches the predicted contrast of one or two layers. Always check them by eye."
      testID="candidates-card"
    >
      {analysis ? (
        analysis.candidates.length ? (
          <View style={styles.list} testID="candidates-list">
            {analysis.candidates.map((candidate, index) => {
              const madeAs = evidence.candidateFlakes.find((made) => made.index === index)?.code ?? null;
              return (
                <CandidateRow
                  key={`${candidate.boxPx.x},${candidate.boxPx.y}`}
                  index={index}
                  candidate={candidate}
                  umPerPixel={umPerPixel}
                  selected={selected === index}
                  onSelect={() => onSelect(index)}
                  onMake={canWrite && onChip && !madeAs ? () => make(index) : null}
                  making={makeFlake.isPending && makeFlake.variables?.index === index}
                  madeAs={madeAs}
                />
              );
            })}
            {analysis.totalFound > analysis.candidates.length ? (
              <Text variant="caption" tone="muted">
                {`${analysis.totalFound} regions were found; the ${analysis.candidates.length} largest are listed.`}
              </Text>
            ) : null}
          </View>
        ) : (
          <Text tone="muted" testID="candidates-none">
            {`No area of at least ${formatNumber(analysis.minAreaUm2)} µm² falls in the one- or two-layer window.`}
          </Text>
        )
      ) : (
        <>
          <Text tone="muted" testID="candidates-not-run">
            {evidence.analysis.notes?.length
              ? evidence.analysis.notes.join(' ')
              : 'The finder needs a calibration (µm per pixel), the material and the substrate.'}
          </Text>
          {canWrite && onChip && !evidence.metadata.calibrationId ? (
            <CalibrationChooser evidence={evidence} onSaved={() => find.mutate(evidence.id)} />
          ) : null}
        </>
      )}
      {analysis?.notes.map((note) => (
        <Text key={note} variant="caption" tone="muted">
          {note}
        </Text>
      ))}
      <FormProblem title="Could not make the flake" error={makeFlake.error} />
      <FormProblem title="Could not look for candidates" error={find.error} />
      {canWrite && onChip ? (
        <Button
          title={analysis ? 'Look again' : 'Look for monolayers'}
          icon="search-outline"
          variant="secondary"
          loading={find.isPending}
          onPress={() => find.mutate(evidence.id)}
          testID="candidates-run"
        />
      ) : null}
    </Card>
  );
}

/** Names the calibration a micrograph was taken with after the fact, then runs the finder with it. */
function CalibrationChooser({ evidence, onSaved }: { evidence: Micrograph; onSaved: () => void }) {
  const calibrations = useCalibrationsQuery();
  const update = useUpdateEvidenceMutation();
  const [choice, setChoice] = useState<string | null>(null);
  if (!calibrations.data?.length) {
    return (
      <TextLink href="/calibrations" testID="candidates-add-calibration">
        Add a calibration first
      </TextLink>
    );
  }
  const apply = () => {
    if (choice === null) return;
    // The scale and objective come from the calibration; old values would contradict it.
    const { umPerPixel: _scale, objectiveMagnification: _objective, ...rest } = evidence.metadata;
    update.mutate(
      { id: evidence.id, version: evidence.version, metadata: { ...rest, calibrationId: Number(choice) } },
      { onSuccess: onSaved },
    );
  };
  return (
    <View style={styles.chooser}>
      <ChoiceChips
        label="Taken with"
        choices={calibrations.data.map((calibration) => ({
          value: String(calibration.id),
          label: `${calibration.microscope} · ${formatNumber(calibration.objectiveMagnification)}× · ${formatNumber(calibration.umPerPixel, 3)} µm/px`,
        }))}
        value={choice}
        onChange={setChoice}
        testID="candidates-calibration"
      />
      <FormProblem title="Could not save the calibration" error={update.error} />
      <Button
        title="Use it and look for monolayers"
        icon="checkmark"
        disabled={choice === null}
        loading={update.isPending}
        onPress={apply}
        testID="candidates-calibration-apply"
      />
    </View>
  );
}

interface CandidateRowProps {
  index: number;
  candidate: LayerCandidate;
  umPerPixel: number | null;
  selected: boolean;
  onSelect: () => void;
  onMake: (() => void) | null;
  making: boolean;
  /** The flake this candidate already became, if any. */
  madeAs: string | null;
}

function CandidateRow({ index, candidate, umPerPixel, selected, onSelect, onMake, making, madeAs }: CandidateRowProps) {
  const { colors } = useTheme();
  const { x, y } = candidate.centroidPx;
  const position = umPerPixel
    ? `at ${formatNumber(x * umPerPixel, 4)}, ${formatNumber(y * umPerPixel, 4)} µm from the top-left corner`
    : `at pixel ${Math.round(x)}, ${Math.round(y)}`;
  return (
    <View
      style={[
        styles.row,
        {
          borderColor: selected ? colors.primary : colors.hairline,
          backgroundColor: selected ? colors.primarySoft : 'transparent',
        },
      ]}
      testID={`candidate-${index}`}
    >
      <View style={[styles.badge, { borderColor: MARKER_COLOURS.candidate, backgroundColor: MARKER_COLOURS.halo }]}>
        <Text variant="label" style={{ color: MARKER_COLOURS.candidate }}>
          {String(index + 1)}
        </Text>
      </View>
      <View style={styles.rowText}>
        <Text variant="label">{`${layersWord(candidate.layers)} window · ${formatNumber(candidate.areaUm2)} µm²`}</Text>
        <Text variant="caption" tone="muted">
          {position}
        </Text>
      </View>
      <View style={styles.rowActions}>
        <Button
          title={selected ? 'Hide' : 'Show'}
          variant="quiet"
          icon={selected ? 'eye-off-outline' : 'eye-outline'}
          onPress={onSelect}
          accessibilityLabel={`${selected ? 'Hide' : 'Show'} candidate ${index + 1} on the image`}
          testID={`candidate-${index}-show`}
        />
        {madeAs ? (
          <TextLink
            href={{ pathname: '/samples/[code]', params: { code: madeAs } }}
            testID={`candidate-${index}-flake`}
          >{`Made as ${madeAs}`}</TextLink>
        ) : null}
        {onMake ? (
          <Button
            title="Make a flake"
            icon="add-circle-outline"
            variant="secondary"
            loading={making}
            onPress={onMake}
            accessibilityLabel={`Make a flake record from candidate ${index + 1}`}
            testID={`candidate-${index}-make`}
          />
        ) : null}
      </View>
    </View>
  );
}

const BADGE = sizes.touchTarget - space.md;

const styles = StyleSheet.create({
  list: { gap: space.sm },
  chooser: { gap: space.md },
  row: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    alignItems: 'center',
    gap: space.md,
    padding: space.sm,
    borderWidth: sizes.hairline,
    borderRadius: radii.md,
  },
  badge: { width: BADGE, height: BADGE, borderRadius: BADGE / 2, borderWidth: 2, alignItems: 'center', justifyContent: 'center' },
  rowText: { flexGrow: 1, flexShrink: 1, flexBasis: 180, gap: space.xxs },
  rowActions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.xs },
});
