import { useRouter } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { parseCode } from '@/shared/codes';
import { SAMPLE_CODE_PREFIXES } from '@/shared/samples';
import { STEP_NOTES_MAX_LENGTH, StepCreateInput } from '@/shared/schemas/step';
import { STEP_CAUTIONS, type StepType } from '@/shared/steps';
import { space } from '@/components/theme';
import { canWriteSamples, WritersOnlyState } from '@/components/samples/writers-only';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { errorsFromIssues, errorsFromRequest, partitionErrors, type PathErrors } from '@/components/ui/field-errors';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { unusualStepValues } from '@/shared/step-warnings';
import { WarningsNotice } from './warnings-notice';
import { Screen } from '@/components/ui/screen';
import { Text } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { useSessionQuery } from '@/hooks/use-session';
import { useLogStepMutation } from '@/hooks/use-steps';
import { STEP_TYPE_CHOICES, USUAL_OUTPUT } from './step-fields';
import {
  blankStepValues,
  defaultParameterValues,
  isShownKey,
  localDate,
  localTime,
  stepCandidate,
  withoutErrorsUnder,
  type StepFormValues,
} from './step-form-values';
import { StepInputsPicker } from './step-inputs-picker';
import { StepOutputsEditor } from './step-outputs-editor';
import { StepParameterFields } from './step-parameter-fields';

const PREFIXES = Object.values(SAMPLE_CODE_PREFIXES);

/** A code from a link, written the way the server writes it so the picker can tell it is already added. */
function canonicalCode(code: string): string {
  const parsed = parseCode(code, PREFIXES);
  return parsed.ok ? parsed.code : code;
}

export function LogStepScreen({ inputCode }: { inputCode: string | null }) {
  const session = useSessionQuery();
  if (!canWriteSamples(session.data)) {
    return (
      <Screen title="Log a step" testID="log-step-screen">
        <WritersOnlyState task="log steps" role={session.data?.role} />
      </Screen>
    );
  }
  return <LogStepForm inputCode={inputCode ? canonicalCode(inputCode) : null} />;
}

/**
 * One form for every step type: the type, its parameters (from the field table), when it
 * started, what it used and what it made, logged in one request.
 */
function LogStepForm({ inputCode }: { inputCode: string | null }) {
  const router = useRouter();
  const logStep = useLogStepMutation();
  const [values, setValues] = useState<StepFormValues>(() => blankStepValues(new Date(), inputCode));
  const [errors, setErrors] = useState<PathErrors>({});

  const change = (patch: Partial<StepFormValues>, clears: string) => {
    setValues((current) => ({ ...current, ...patch }));
    setErrors((current) => withoutErrorsUnder(current, clears));
  };

  // Until the person changes the outputs, they follow the type: its usual output, one of it.
  const [outputsTouched, setOutputsTouched] = useState(false);

  const chooseType = (type: StepType) => {
    const usual = USUAL_OUTPUT[type];
    setValues((current) => ({
      ...current,
      type,
      parameters: current.parameters[type] ? current.parameters : { ...current.parameters, [type]: defaultParameterValues(type) },
      outputs: outputsTouched ? current.outputs : usual ? [{ key: 1, kind: usual, count: '1', material: '' }] : [],
    }));
    setErrors({});
    logStep.reset();
  };

  const setParameter = (type: StepType, name: string, text: string) =>
    change(
      { parameters: { ...values.parameters, [type]: { ...(values.parameters[type] ?? {}), [name]: text } } },
      `parameters.${name}`,
    );

  const submit = () => {
    const { candidate, startProblem } = stepCandidate(values);
    const parsed = StepCreateInput.safeParse(candidate);
    const found: PathErrors = parsed.success ? {} : errorsFromIssues(parsed.error.issues);
    if (startProblem) found.startedAt = [startProblem];
    if (!parsed.success || startProblem) {
      setErrors(found);
      return;
    }
    setErrors({});
    logStep.mutate(parsed.data, {
      onSuccess: (step) => router.replace({ pathname: '/steps/[id]', params: { id: String(step.id), logged: '1' } }),
      onError: (error) => setErrors(errorsFromRequest(error)),
    });
  };

  const { type } = values;
  const caution = type ? STEP_CAUTIONS[type] : undefined;
  const draft = StepCreateInput.safeParse(stepCandidate(values).candidate);
  const unusual = draft.success ? unusualStepValues(draft.data) : [];
  const { placed, rest } = partitionErrors(errors, (key) => isShownKey(key, type));

  return (
    <Screen
      title="Log a step"
      lead="What was done, with what, and what came of it. New samples get their codes when the step is logged."
      testID="log-step-screen"
    >
      <Card title="Step type">
        <ChoiceChips
          label="Step type"
          hideLabel
          choices={STEP_TYPE_CHOICES}
          value={type}
          onChange={chooseType}
          errors={placed.type}
          large
          testID="step-type"
        />
      </Card>

      {type ? (
        <Card
          title="Parameters"
          lead="As set on the instrument or at the bench. Units are in the labels."
          testID="step-parameters"
        >
          {caution ? (
            <Notice tone="warn" title="Caution" testID="step-caution">
              {caution}
            </Notice>
          ) : null}
          <StepParameterFields
            type={type}
            values={values.parameters[type] ?? {}}
            onChange={(name, text) => setParameter(type, name, text)}
            errors={placed}
          />
          <WarningsNotice warnings={unusual} title="Unusual values — check before logging" />
        </Card>
      ) : null}

      <Card title="When and where">
        <View style={styles.when}>
          <View style={styles.date}>
            <TextField
              label="Started on"
              hint="YYYY-MM-DD"
              value={values.date}
              onChangeText={(date) => change({ date }, 'startedAt')}
              errors={placed.startedAt}
              inputMode="numeric"
              keyboardType="numbers-and-punctuation"
              autoComplete="off"
              testID="step-date"
            />
          </View>
          <View style={styles.time}>
            <TextField
              label="At"
              hint="HH:MM, 24-hour"
              value={values.time}
              onChangeText={(time) => change({ time }, 'startedAt')}
              inputMode="numeric"
              keyboardType="numbers-and-punctuation"
              autoComplete="off"
              testID="step-time"
            />
          </View>
        </View>
        <Button
          title="Set to now"
          variant="quiet"
          icon="time-outline"
          onPress={() => {
            const now = new Date();
            change({ date: localDate(now), time: localTime(now) }, 'startedAt');
          }}
          testID="step-now"
        />
        <TextField
          label="Instrument (optional)"
          value={values.instrument}
          onChangeText={(instrument) => change({ instrument }, 'instrument')}
          errors={placed.instrument}
          autoComplete="off"
          testID="step-instrument"
        />
        <TextField
          label="Notes (optional)"
          value={values.notes}
          onChangeText={(notes) => change({ notes }, 'notes')}
          errors={placed.notes}
          maxLength={STEP_NOTES_MAX_LENGTH}
          multiline
          numberOfLines={3}
          testID="step-notes"
        />
      </Card>

      <Card title="Samples used" lead="Everything the step started from. Mark what it used up.">
        <StepInputsPicker items={values.inputs} onChange={(inputs) => change({ inputs }, 'inputs')} errors={placed} />
      </Card>

      <Card title="New samples" lead="What the step made. Each one gets its own code and label.">
        <StepOutputsEditor
          rows={values.outputs}
          onChange={(outputs) => {
            setOutputsTouched(true);
            change({ outputs }, 'outputs');
          }}
          usualKind={type ? (USUAL_OUTPUT[type] ?? null) : null}
          errors={placed}
        />
      </Card>

      <View style={styles.submit}>
        <FormProblem title="Could not log the step" error={logStep.error} formErrors={rest} />
        {Object.keys(placed).length && !logStep.error ? (
          <Text tone="danger" accessibilityLiveRegion="polite" testID="step-fix-fields">
            Some fields above need attention.
          </Text>
        ) : null}
        <Button title="Log step" icon="checkmark" block onPress={submit} loading={logStep.isPending} testID="step-submit" />
      </View>
    </Screen>
  );
}

const styles = StyleSheet.create({
  when: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  date: { flexGrow: 3, flexBasis: space.xxxl * 4 },
  time: { flexGrow: 2, flexBasis: space.xxxl * 2 },
  submit: { gap: space.md },
});
