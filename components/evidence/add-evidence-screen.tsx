import { useRouter } from 'expo-router';
import { useEffect, useRef, useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { EVIDENCE_KIND_LABELS, EVIDENCE_KINDS, type EvidenceKind } from '@/shared/schemas/evidence';
import type { Sample } from '@/shared/schemas/sample';
import { canWriteSamples, WritersOnlyState } from '@/components/samples/writers-only';
import { space } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { errorsFromRequest, partitionErrors, type PathErrors } from '@/components/ui/field-errors';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { ErrorState, LoadingState } from '@/components/ui/state-views';
import { Text } from '@/components/ui/text';
import { isApiError } from '@/hooks/api-client';
import { UploadCancelledError } from '@/hooks/upload-with-progress';
import { useUploadEvidenceMutation } from '@/hooks/use-evidence';
import { useSampleQuery } from '@/hooks/use-samples';
import { useSessionQuery } from '@/hooks/use-session';
import {
  EMPTY_EVIDENCE_FORM,
  flakeMaterialOf,
  formErrorsFromServer,
  isImageKind,
  metadataFromForm,
  sizeProblem,
  substrateFromSample,
  type EvidenceFormValues,
} from './evidence-form-values';
import { EvidenceMetadataFields } from './evidence-metadata-fields';
import { FilePickCard } from './file-pick-card';
import type { PickedFile } from './picked-file';
import { UploadProgressBar } from './upload-progress';

const KIND_CHOICES = EVIDENCE_KINDS.map((value) => ({ value, label: EVIDENCE_KIND_LABELS[value] }));
/** Fields the form shows messages beside; anything else the server says goes in the banner. */
const PLACED_FIELDS = new Set([
  'file',
  'material',
  'calibrationId',
  'substrate',
  'substrate.oxideThicknessNm',
  'illumination',
  'illumination.centreNm',
  'exposureMs',
  'pixelEncoding',
  'laserNm',
  'xUnit',
  'referenceIntensity',
  'offsetNm',
  'note',
]);

/** What to do about each refusal the server can give an upload, beside its own message. */
const REFUSAL_ADVICE: Record<string, string> = {
  file_type_mismatch:
    'Check that you chose the right file for the kind of evidence: an image for a micrograph, a text file for a spectrum or profile.',
  image_too_large: 'Save a smaller image (crop to the area of interest or lower the resolution) and try again.',
  image_corrupt: 'The image could not be read. Export it again from the camera software as JPEG, PNG or TIFF.',
  spectrum_invalid: 'Open the file in a text editor and fix the line named above, or export it again as two plain columns.',
  payload_too_large: 'The file is larger than the server accepts.',
};

function refusalAdvice(error: unknown): string | null {
  if (!isApiError(error)) return null;
  const code: string = error.code;
  return REFUSAL_ADVICE[code] ?? null;
}

export function AddEvidenceScreen({ code }: { code: string }) {
  const session = useSessionQuery();
  const sample = useSampleQuery(code);
  const title = code ? `Add evidence to ${code}` : 'Add evidence';
  if (!canWriteSamples(session.data)) {
    return (
      <Screen title={title} testID="add-evidence-screen">
        <WritersOnlyState task="add evidence" role={session.data?.role} />
      </Screen>
    );
  }
  return (
    <Screen
      title={title}
      lead="A micrograph, a spectrum or a profile that shows how many layers it has."
      testID="add-evidence-screen"
    >
      {sample.data ? (
        <AddEvidenceForm sample={sample.data} />
      ) : sample.isError ? (
        <ErrorState
          title={`Could not load ${code}`}
          error={sample.error}
          onRetry={() => void sample.refetch()}
          retrying={sample.isFetching}
        />
      ) : (
        <LoadingState label={`Loading ${code}…`} />
      )}
    </Screen>
  );
}

/** The chip a flake was found on, whose substrate the flake lies on. */
function useSubstrateSource(sample: Sample) {
  const ownSubstrate = substrateFromSample(sample);
  const chip = sample.parents.find((parent) => parent.kind === 'chip' || parent.kind === 'film') ?? null;
  const parent = useSampleQuery(chip?.code ?? '', { enabled: ownSubstrate === null && chip !== null });
  if (ownSubstrate) return { substrate: ownSubstrate, from: null };
  const fromParent = substrateFromSample(parent.data);
  return fromParent ? { substrate: fromParent, from: chip?.code ?? null } : { substrate: null, from: null };
}

function AddEvidenceForm({ sample }: { sample: Sample }) {
  const router = useRouter();
  const { mutation, progress, cancel } = useUploadEvidenceMutation(sample.code);
  const substrateSource = useSubstrateSource(sample);
  const [values, setValues] = useState<EvidenceFormValues>(() => ({
    ...EMPTY_EVIDENCE_FORM,
    kind: sample.kind === 'chip' || sample.kind === 'flake' ? 'micrograph' : null,
    material: flakeMaterialOf(sample.material),
    ...(substrateFromSample(sample) ?? {}),
  }));
  const [file, setFile] = useState<PickedFile | null>(null);
  const [errors, setErrors] = useState<PathErrors>({});
  const touchedSubstrate = useRef(false);

  // The chip's substrate arrives after the form is drawn; use it unless the person already chose one.
  const inheritedKind = substrateSource.substrate?.substrateKind ?? null;
  const inheritedOxide = substrateSource.substrate?.oxideThicknessNm ?? '';
  useEffect(() => {
    if (inheritedKind && !touchedSubstrate.current) {
      setValues((current) => ({ ...current, substrateKind: inheritedKind, oxideThicknessNm: inheritedOxide }));
    }
  }, [inheritedKind, inheritedOxide]);

  const change = (patch: Partial<EvidenceFormValues>) => {
    if ('substrateKind' in patch || 'oxideThicknessNm' in patch) touchedSubstrate.current = true;
    setValues((current) => ({ ...current, ...patch }));
    setErrors({});
    mutation.reset();
  };

  const chooseKind = (kind: EvidenceKind) => {
    // An image picked for a micrograph is no spectrum, and the other way round.
    if (values.kind && isImageKind(values.kind) !== isImageKind(kind)) setFile(null);
    change({ kind });
  };

  const kind = values.kind;
  const tooBig = kind && file ? sizeProblem(kind, file.byteSize) : null;

  const submit = () => {
    if (!kind || mutation.isPending) return;
    const checked = metadataFromForm(kind, values);
    if (!file) {
      setErrors({ ...(checked.ok ? {} : checked.errors), file: ['Choose the file to upload.'] });
      return;
    }
    if (!checked.ok) {
      setErrors(checked.errors);
      return;
    }
    if (tooBig) return;
    mutation.mutate(
      { kind, metadata: checked.metadata, file },
      {
        onSuccess: (evidence) => router.replace({ pathname: '/evidence/[id]', params: { id: String(evidence.id), added: '1' } }),
        onError: (error) => setErrors(formErrorsFromServer(errorsFromRequest(error))),
      },
    );
  };

  const cancelled = mutation.error instanceof UploadCancelledError;
  const advice = refusalAdvice(mutation.error);
  const { rest: unplaced } = partitionErrors(errors, (key) => PLACED_FIELDS.has(key));
  const hasPlaced = Object.entries(errors).some(([key, messages]) => PLACED_FIELDS.has(key) && messages.length > 0);

  return (
    <>
      <Card title="What it is">
        <ChoiceChips
          label="Kind of evidence"
          hideLabel
          choices={KIND_CHOICES}
          value={kind}
          onChange={chooseKind}
          large
          testID="evidence-kind"
        />
      </Card>
      {kind ? (
        <>
          <FilePickCard
            kind={kind}
            file={file}
            onPick={(picked) => {
              setFile(picked);
              setErrors((current) => ({ ...current, file: [] }));
              mutation.reset();
            }}
            errors={[...(errors.file ?? []), ...(tooBig ? [tooBig] : [])]}
          />
          <Card title="About it" testID="evidence-metadata">
            {substrateSource.from && !touchedSubstrate.current ? (
              <Text variant="caption" tone="muted" testID="evidence-substrate-from">
                {`Substrate filled in from the chip ${substrateSource.from}.`}
              </Text>
            ) : null}
            <EvidenceMetadataFields kind={kind} values={values} errors={errors} onChange={change} />
          </Card>
          <View style={styles.submit}>
            {mutation.isPending ? (
              <UploadProgressBar progress={progress} fileBytes={file?.byteSize ?? null} onCancel={cancel} />
            ) : null}
            {cancelled ? (
              <Notice tone="info" title="Upload cancelled" testID="upload-cancelled">
                Nothing was stored. Upload again when ready.
              </Notice>
            ) : (
              <FormProblem
                title="The file was not added"
                error={mutation.error}
                formErrors={[...unplaced, ...(hasPlaced && !mutation.error ? ['Some fields above need attention.'] : [])]}
              />
            )}
            {advice ? (
              <Text variant="caption" testID="upload-advice">
                {advice}
              </Text>
            ) : null}
            <Button
              title={mutation.isPending ? 'Uploading…' : 'Upload and analyse'}
              icon="cloud-upload-outline"
              block
              loading={mutation.isPending}
              disabled={tooBig !== null}
              onPress={submit}
              testID="evidence-submit"
            />
          </View>
        </>
      ) : null}
    </>
  );
}

const styles = StyleSheet.create({
  submit: { gap: space.md },
});
