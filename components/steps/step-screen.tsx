import { Link } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import type { Step } from '@/shared/schemas/step';
import { STEP_TYPE_LABELS } from '@/shared/steps';
import { space } from '@/components/theme';
import { PrintLabelsButton } from '@/components/labels/print-labels';
import { SampleChip, SampleChips } from '@/components/samples/sample-chip';
import { canWriteSamples } from '@/components/samples/writers-only';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { DetailRow } from '@/components/ui/detail-row';
import { formatDateTime } from '@/components/ui/format';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { ErrorState, LoadingState } from '@/components/ui/state-views';
import { Text } from '@/components/ui/text';
import { isApiError } from '@/hooks/api-client';
import { useSessionQuery } from '@/hooks/use-session';
import { useStepQuery } from '@/hooks/use-steps';
import { formatParameter, stepFields } from './step-fields';

export interface StepScreenProps {
  id: number | null;
  /** Shown straight after logging: say so, and point at the new samples. */
  justLogged: boolean;
}

/** One logged step: what was done, by whom and when, its parameters, and the samples on each side. */
export function StepScreen({ id, justLogged }: StepScreenProps) {
  const step = useStepQuery(id ?? 0);
  const session = useSessionQuery();

  if (id === null || isApiError(step.error, 'not_found')) {
    return (
      <Screen title="Step" testID="step-screen">
        <Notice tone="warn" title="No such step" testID="step-missing">
          The link may be mistyped. Steps are reached from a sample’s “Made by” or its history.
        </Notice>
      </Screen>
    );
  }

  if (!step.data) {
    return (
      <Screen title={`Step ${id}`} testID="step-screen">
        {step.isError ? (
          <ErrorState
            title={`Could not load step ${id}`}
            error={step.error}
            onRetry={() => void step.refetch()}
            retrying={step.isFetching}
          />
        ) : (
          <LoadingState label={`Loading step ${id}…`} />
        )}
      </Screen>
    );
  }

  const record = step.data;
  const made = record.outputs.length;
  const printOutputs = (testID: string, variant: 'primary' | 'secondary') => (
    <PrintLabelsButton
      target={{ kind: 'step', stepId: record.id }}
      what={`Labels for the ${made === 1 ? 'sample' : `${made} samples`} this step made.`}
      title={made === 1 ? 'Print its label' : `Print their ${made} labels`}
      variant={variant}
      testID={testID}
    />
  );
  // Straight after logging, the offer to print sits in the "Step logged" notice instead.
  const offerInNotice = justLogged && made > 0;
  const actions = (
    <>
      {made > 0 && !offerInNotice ? printOutputs('step-print-labels', 'secondary') : null}
      {canWriteSamples(session.data) ? (
        <Link href="/steps/new" asChild>
          <Button title="Log another step" icon="git-merge-outline" variant="secondary" testID="step-log-another" />
        </Link>
      ) : null}
    </>
  );

  return (
    <Screen
      title={STEP_TYPE_LABELS[record.type]}
      lead={`Step ${record.id}${record.operator ? ` · by ${record.operator.displayName}` : ''}`}
      actions={actions}
      testID="step-screen"
    >
      {justLogged ? (
        <Notice
          tone="success"
          title="Step logged"
          testID="step-logged"
          action={offerInNotice ? printOutputs('step-logged-print', 'primary') : undefined}
        >
          {made
            ? `${made} new ${made === 1 ? 'sample has its code' : 'samples have their codes'}. Print their labels now, or tap one to open it.`
            : 'It is now in the history of every sample it used or treated.'}
        </Notice>
      ) : null}
      <SamplesCard step={record} />
      <DetailsCard step={record} />
      <ParametersCard step={record} />
    </Screen>
  );
}

function SamplesCard({ step }: { step: Step }) {
  return (
    <Card title="Samples" testID="step-samples">
      <DetailRow label="Made">
        <SampleChips samples={step.outputs} empty="No new samples" testID="step-outputs" />
      </DetailRow>
      <DetailRow label="Used">
        {step.inputs.length ? (
          <View style={styles.chips} testID="step-inputs">
            {step.inputs.map((input) => (
              <SampleChip key={input.code} sample={input} note={input.consumed ? 'used up here' : undefined} />
            ))}
          </View>
        ) : (
          <Text tone="muted">None</Text>
        )}
      </DetailRow>
      {step.treated.length ? (
        <DetailRow label="Treated in place">
          <SampleChips samples={step.treated} empty="None" testID="step-treated" />
        </DetailRow>
      ) : null}
    </Card>
  );
}

function DetailsCard({ step }: { step: Step }) {
  return (
    <Card title="Details" testID="step-details">
      <View style={styles.facts}>
        <DetailRow label="Operator">{step.operator?.displayName ?? 'Not recorded'}</DetailRow>
        <DetailRow label="Started">{step.startedAt ? formatDateTime(step.startedAt) : 'Not recorded'}</DetailRow>
        <DetailRow label="Ended">{step.endedAt ? formatDateTime(step.endedAt) : 'Not recorded'}</DetailRow>
        <DetailRow label="Instrument">{step.instrument ?? 'Not recorded'}</DetailRow>
        <DetailRow label="Logged">{formatDateTime(step.createdAt)}</DetailRow>
      </View>
      {step.notes ? <DetailRow label="Notes">{step.notes}</DetailRow> : null}
    </Card>
  );
}

/** Known parameters in the form's order with their units; anything else the record holds after them. */
function ParametersCard({ step }: { step: Step }) {
  const fields = stepFields(step.type);
  const known = new Set(fields.map((field) => field.name));
  const rows = [
    ...fields
      .filter((field) => step.parameters[field.name] !== undefined)
      .map((field) => ({ name: field.name, label: field.label, value: formatParameter(field, step.parameters[field.name]) })),
    ...Object.entries(step.parameters)
      .filter(([name]) => !known.has(name))
      .map(([name, value]) => ({ name, label: name, value: formatParameter(undefined, value) })),
  ];
  return (
    <Card title="Parameters" testID="step-parameters">
      {rows.length ? (
        <View style={styles.facts}>
          {rows.map((row) => (
            <DetailRow key={row.name} label={row.label} testID={`step-parameter-${row.name}`}>
              {row.value}
            </DetailRow>
          ))}
        </View>
      ) : (
        <Text tone="muted">None recorded.</Text>
      )}
    </Card>
  );
}

const styles = StyleSheet.create({
  chips: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  facts: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.xl, rowGap: space.md },
});
