import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { FLAKE_MATERIAL_IDS, FLAKE_MATERIALS, type FlakeMaterialId } from '@/shared/optics/materials';
import type { Evidence, EvidenceSubstrate } from '@/shared/schemas/evidence';
import type { Region } from '@/shared/schemas/evidence-analysis';
import { space } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { errorsFromIssues, errorsFromRequest, partitionErrors, type PathErrors } from '@/components/ui/field-errors';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { Text } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { useBreakpoints } from '@/hooks/use-breakpoints';
import { useComputeContrastMutation } from '@/hooks/use-evidence';
import { EvidenceSubstrate as SubstrateSchema } from '@/shared/schemas/evidence';
import { CandidatesCard } from './candidates-card';
import { ContrastResultCard } from './contrast-result';
import { OXIDE_PRESETS_NM, type SubstrateKind } from './evidence-form-values';
import { MicrographMarker, type MarkTarget } from './micrograph-marker';
import { numberFromText } from './number-text';
import { MARKER_COLOURS } from './plot-colors';

type Micrograph = Extract<Evidence, { kind: 'micrograph' }>;

const MATERIAL_CHOICES = FLAKE_MATERIAL_IDS.map((value) => ({ value, label: FLAKE_MATERIALS[value].displayName }));
const SUBSTRATE_CHOICES: { value: SubstrateKind; label: string }[] = [
  { value: 'oxide-on-silicon', label: 'Si with SiO₂' },
  { value: 'sapphire', label: 'Sapphire' },
  { value: 'quartz', label: 'Quartz' },
];
/** Messages shown beside a field; the rest (e.g. a region the server refused) go in the banner. */
const PLACED_FIELDS = new Set(['material', 'substrate', 'oxideThicknessNm', 'substrate.oxideThicknessNm']);
const TARGET_CHOICES: { value: MarkTarget; label: string }[] = [
  { value: 'flake', label: 'Flake' },
  { value: 'substrate', label: 'Bare substrate' },
];

function regionWords(region: Region | null): string {
  if (!region) return 'not marked yet';
  if (region.shape === 'box') return `${Math.round(region.width)} × ${Math.round(region.height)} px box`;
  return `${region.points.length} tapped points`;
}

/** The substrate the micrograph was taken on, as recorded or as the last analysis assumed. */
function knownSubstrate(evidence: Micrograph): EvidenceSubstrate | null {
  return evidence.metadata.substrate ?? evidence.analysis.contrast?.substrate ?? evidence.analysis.candidates?.substrate ?? null;
}

/**
 * A micrograph: mark the flake and the bare substrate beside it, compute the contrast and compare
 * it with the predicted contrast of 1…10 layers; and the monolayer candidates found on the image.
 */
export function MicrographEvidence({ evidence, canWrite }: { evidence: Micrograph; canWrite: boolean }) {
  const { isWide } = useBreakpoints();
  const compute = useComputeContrastMutation();
  const [flakeRegion, setFlakeRegion] = useState<Region | null>(evidence.metadata.flakeRegion ?? null);
  const [substrateRegion, setSubstrateRegion] = useState<Region | null>(evidence.metadata.substrateRegion ?? null);
  const [target, setTarget] = useState<MarkTarget>(evidence.metadata.flakeRegion ? 'substrate' : 'flake');
  const [selectedCandidate, setSelectedCandidate] = useState<number | null>(null);
  const initialSubstrate = knownSubstrate(evidence);
  const [material, setMaterial] = useState<FlakeMaterialId | null>(
    evidence.metadata.material ?? evidence.analysis.contrast?.material ?? null,
  );
  const [substrateKind, setSubstrateKind] = useState<SubstrateKind | null>(initialSubstrate?.kind ?? null);
  const [oxideText, setOxideText] = useState(
    initialSubstrate?.kind === 'oxide-on-silicon' ? String(initialSubstrate.oxideThicknessNm) : '',
  );
  const [errors, setErrors] = useState<PathErrors>({});

  const file = evidence.file;
  // Browsers other than Safari cannot show TIFF; its preview has the same proportions, so marks still land in place.
  const shownUrl = file.mediaType === 'image/tiff' && file.thumbnailUrl ? file.thumbnailUrl : file.url;
  const candidates = evidence.analysis.candidates;

  const mark = (which: MarkTarget, region: Region) => {
    compute.reset();
    if (which === 'flake') {
      setFlakeRegion(region);
      if (!substrateRegion) setTarget('substrate');
    } else {
      setSubstrateRegion(region);
    }
  };

  const submit = () => {
    if (!flakeRegion || !substrateRegion) return;
    const substrate =
      substrateKind === null
        ? undefined
        : SubstrateSchema.safeParse(
            substrateKind === 'oxide-on-silicon'
              ? { kind: substrateKind, oxideThicknessNm: numberFromText(oxideText) ?? Number.NaN }
              : { kind: substrateKind },
          );
    const problems: PathErrors = {};
    if (!material) problems.material = ['Choose the material of the flake.'];
    if (!substrate) problems.substrate = ['Choose the substrate.'];
    else if (!substrate.success) Object.assign(problems, errorsFromIssues(substrate.error.issues));
    if (Object.keys(problems).length || !material || !substrate?.success) {
      setErrors(problems);
      return;
    }
    setErrors({});
    compute.mutate(
      {
        id: evidence.id,
        input: { version: evidence.version, flakeRegion, substrateRegion, material, substrate: substrate.data },
      },
      { onError: (error) => setErrors(errorsFromRequest(error)) },
    );
  };

  const marker =
    file.widthPx && file.heightPx ? (
      <MicrographMarker
        imageUrl={shownUrl}
        widthPx={file.widthPx}
        heightPx={file.heightPx}
        flakeRegion={flakeRegion}
        substrateRegion={substrateRegion}
        target={canWrite ? target : null}
        onMark={mark}
        candidates={(candidates?.candidates ?? []).map((candidate, index) => ({
          key: String(index),
          box: candidate.boxPx,
          label: `${index + 1}`,
          selected: index === selectedCandidate,
        }))}
        accessibilityLabel={`Micrograph ${evidence.originalName ?? ''}, ${file.widthPx} by ${file.heightPx} pixels. Flake region ${regionWords(flakeRegion)}, substrate region ${regionWords(substrateRegion)}.`}
        testID="micrograph-marker"
      />
    ) : (
      <Notice tone="warn" title="The image size is unknown">
        The server did not record this image’s pixel size, so regions cannot be marked on it.
      </Notice>
    );

  const markCard = (
    <Card
      title={canWrite ? 'Mark the flake and the substrate' : 'Micrograph'}
      lead={
        canWrite
          ? 'Drag a box over a flat, even part of the flake, then another over clean substrate right beside it.'
          : undefined
      }
      testID="micrograph-card"
    >
      {canWrite ? (
        <ChoiceChips label="Drag to mark" choices={TARGET_CHOICES} value={target} onChange={setTarget} testID="mark-target" />
      ) : null}
      {marker}
      <View style={styles.regions}>
        <RegionLine colour={MARKER_COLOURS.flake} label="Flake" region={flakeRegion} testID="region-flake" />
        <RegionLine colour={MARKER_COLOURS.substrate} label="Substrate" region={substrateRegion} testID="region-substrate" />
      </View>
      {file.mediaType === 'image/tiff' ? (
        <Text variant="caption" tone="muted">
          Showing the preview of this TIFF; the contrast is measured on the full-resolution file.
        </Text>
      ) : null}
      {canWrite ? (
        <>
          <ChoiceChips
            label="Material"
            choices={MATERIAL_CHOICES}
            value={material}
            onChange={(next) => {
              setMaterial(next);
              setErrors({});
            }}
            errors={errors.material}
            testID="contrast-material"
          />
          <ChoiceChips
            label="Substrate"
            choices={SUBSTRATE_CHOICES}
            value={substrateKind}
            onChange={(next) => {
              setSubstrateKind(next);
              setErrors({});
            }}
            errors={errors.substrate}
            testID="contrast-substrate"
          />
          {substrateKind === 'oxide-on-silicon' ? (
            <TextField
              label="Oxide thickness (nm)"
              hint={`Usually ${OXIDE_PRESETS_NM.join(', ')} nm; the chip’s record says which.`}
              value={oxideText}
              onChangeText={(text) => {
                setOxideText(text);
                setErrors({});
              }}
              errors={errors.oxideThicknessNm ?? errors['substrate.oxideThicknessNm']}
              inputMode="decimal"
              keyboardType="decimal-pad"
              testID="contrast-oxide"
            />
          ) : null}
          <FormProblem
            title="Could not compute the contrast"
            error={compute.error}
            formErrors={partitionErrors(errors, (key) => PLACED_FIELDS.has(key)).rest}
          />
          <Button
            title="Compute contrast"
            icon="calculator-outline"
            block
            disabled={!flakeRegion || !substrateRegion}
            loading={compute.isPending}
            onPress={submit}
            testID="compute-contrast"
          />
        </>
      ) : null}
    </Card>
  );

  const results = (
    <>
      {evidence.analysis.contrast ? (
        <ContrastResultCard analysis={evidence.analysis.contrast} />
      ) : (
        <Card title="Optical contrast">
          <Text tone="muted">
            {canWrite
              ? 'Mark both regions and press “Compute contrast” to get a layer count from this micrograph.'
              : 'No one has marked this micrograph yet.'}
          </Text>
        </Card>
      )}
      {/* The finder looks over whole chips; a flake's own micrograph is for marking. */}
      {evidence.sample?.kind === 'chip' || candidates ? (
        <CandidatesCard
          evidence={evidence}
          canWrite={canWrite}
          selected={selectedCandidate}
          onSelect={(index) => setSelectedCandidate((current) => (current === index ? null : index))}
        />
      ) : null}
    </>
  );

  if (isWide) {
    return (
      <View style={styles.columns}>
        <View style={styles.imageColumn}>{markCard}</View>
        <View style={styles.resultColumn}>{results}</View>
      </View>
    );
  }
  return (
    <>
      {markCard}
      {results}
    </>
  );
}

function RegionLine({ colour, label, region, testID }: { colour: string; label: string; region: Region | null; testID: string }) {
  return (
    <View style={styles.regionLine} testID={testID}>
      <View style={[styles.swatch, { borderColor: colour }]} />
      <Text variant="caption">{`${label}: ${regionWords(region)}`}</Text>
    </View>
  );
}

const SWATCH = space.lg;

const styles = StyleSheet.create({
  columns: { flexDirection: 'row', alignItems: 'flex-start', gap: space.lg },
  imageColumn: { flex: 3, gap: space.lg },
  resultColumn: { flex: 2, gap: space.lg },
  regions: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.lg, rowGap: space.xs },
  regionLine: { flexDirection: 'row', alignItems: 'center', gap: space.xs },
  swatch: { width: SWATCH, height: SWATCH * 0.7, borderWidth: 3 },
});
