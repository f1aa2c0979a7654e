import { z } from 'zod';
import { useRef, useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { unusualStepValues } from '@/shared/step-warnings';
import { SUBSTRATE_LABELS, SUBSTRATES } from '@/shared/schemas/sample';
import { EXFOLIATION_METHODS, PRETREATMENTS, STEP_OUTPUT_COUNT_MAX, type Step } from '@/shared/schemas/step';
import { space } from '@/components/theme';
import { canWriteSamples, WritersOnlyState } from '@/components/samples/writers-only';
import { STEP_FIELDS } from '@/components/steps/step-fields';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { errorsFromIssues, errorsFromRequest, type PathErrors } from '@/components/ui/field-errors';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { Text } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { readBenchDefaults, useMyStepsQuery, writeBenchDefaults } from '@/hooks/use-bench';
import { useSessionQuery } from '@/hooks/use-session';
import { newIdempotencyKey, useOutboxItem, useStepOutbox, type StepWarning } from '@/hooks/use-step-outbox';
import {
  EMPTY_EXFOLIATION,
  exfoliationParameters,
  OXIDE_PRESETS,
  parseExfoliation,
  rememberedPart,
  valuesFromBody,
  valuesFromStep,
  withRemembered,
  type ExfoliationValues,
} from './exfoliation-values';
import { KindPicker } from './kind-picker';
import { WarningsNotice } from '@/components/steps/warnings-notice';
import { RunLogged } from './run-logged';
import { Stepper } from './stepper';
import { TemplatesCard } from './templates-card';

const FORM = 'exfoliation';
/** What an exfoliation template keeps: the parameters and how many chips are usually made. */
const TemplateBody = z.object({
  parameters: z.record(z.string(), z.unknown()).default({}),
  chipCount: z.number().int().positive().optional(),
});
const choicesOfField = (name: string) => STEP_FIELDS.exfoliation.find((field) => field.name === name)?.choices ?? [];
const labelOf = (name: string, value: string) => choicesOfField(name).find((choice) => choice.value === value)?.label ?? value;
const METHOD_CHOICES = EXFOLIATION_METHODS.map((value) => ({ value, label: labelOf('method', value) }));
const PRETREATMENT_CHOICES = PRETREATMENTS.map((value) => ({ value, label: labelOf('pretreatment', value) }));
const SUBSTRATE_CHOICES = SUBSTRATES.map((value) => ({ value, label: SUBSTRATE_LABELS[value] }));
const OXIDE_CHOICES = [...OXIDE_PRESETS.map((value) => ({ value, label: `${value} nm` })), { value: 'other', label: 'Other' }];
const PEEL_MAX = 1000;

export interface QuickExfoliationScreenProps {
  crystal: string | null;
  /** A refused run from the outbox, opened to be corrected. */
  outboxKey: string | null;
}

export function QuickExfoliationScreen(props: QuickExfoliationScreenProps) {
  const session = useSessionQuery();
  if (!canWriteSamples(session.data)) {
    return (
      <Screen title="Log exfoliation" testID="quick-exfoliation-screen">
        <WritersOnlyState task="log runs" role={session.data?.role} />
      </Screen>
    );
  }
  return <QuickExfoliationForm {...props} userId={session.data?.id} />;
}

type Outcome = { kind: 'sent'; step: Step; warnings: readonly StepWarning[] } | { kind: 'queued' } | null;

function QuickExfoliationForm({ crystal, outboxKey, userId }: QuickExfoliationScreenProps & { userId: number | undefined }) {
  const outbox = useStepOutbox();
  const correcting = useOutboxItem(outboxKey);
  const lastRun = useMyStepsQuery('exfoliation', 1);
  const recent = useMyStepsQuery('exfoliation', 10);
  const initial = (): ExfoliationValues => {
    const remembered = withRemembered(EMPTY_EXFOLIATION, readBenchDefaults(FORM, userId));
    if (correcting) return valuesFromBody(correcting.body, remembered);
    return { ...remembered, crystal: crystal ?? '' };
  };
  const [values, setValues] = useState<ExfoliationValues>(initial);
  const [errors, setErrors] = useState<PathErrors>({});
  const [problem, setProblem] = useState<unknown>(null);
  const [busy, setBusy] = useState(false);
  const [outcome, setOutcome] = useState<Outcome>(null);
  // One key per submission: kept while the same values are sent again, new once anything changes.
  const keyRef = useRef<string | null>(null);
  const [oxideOther, setOxideOther] = useState(
    () => values.oxideThicknessNm !== '' && !OXIDE_PRESETS.some((preset) => preset === values.oxideThicknessNm),
  );

  const change = (patch: Partial<ExfoliationValues>) => {
    keyRef.current = null;
    setValues((current) => ({ ...current, ...patch }));
    setErrors({});
    setProblem(null);
  };

  const tapes = Array.from(
    new Set(
      [values.tapeType, ...(recent.data ?? []).map((step) => step.parameters.tapeType)].filter(
        (tape): tape is string => typeof tape === 'string' && tape.trim() !== '',
      ),
    ),
  ).slice(0, 5);

  const repeatLast = () => {
    const step = lastRun.data?.[0];
    if (!step) return;
    change(
      valuesFromStep(
        step.parameters,
        { crystal: step.inputs[0]?.code ?? '', chipCount: step.outputs.length || values.chipCount, notes: '' },
        values,
      ),
    );
    setOxideOther(
      typeof step.parameters.oxideThicknessNm === 'number' &&
        !OXIDE_PRESETS.some((p) => p === String(step.parameters.oxideThicknessNm)),
    );
  };

  const parsed = parseExfoliation(values, new Date());
  const preview = parsed.success ? unusualStepValues(parsed.data) : [];

  const submit = () => {
    if (busy) return;
    const result = parseExfoliation(values, new Date());
    if (!result.success) {
      setErrors(errorsFromIssues(result.error.issues));
      return;
    }
    keyRef.current ??= newIdempotencyKey();
    setBusy(true);
    setProblem(null);
    const summary = `Exfoliation of ${values.crystal}, ${values.chipCount} ${values.chipCount === 1 ? 'chip' : 'chips'}`;
    outbox
      .submit({ key: keyRef.current, body: result.data, summary, replaces: correcting?.key ?? null })
      .then((sent) => {
        writeBenchDefaults(FORM, userId, rememberedPart(values));
        keyRef.current = null;
        setOutcome(
          sent.kind === 'sent' ? { kind: 'sent', step: sent.created.step, warnings: sent.created.warnings } : { kind: 'queued' },
        );
      })
      .catch((error: unknown) => {
        setProblem(error);
        setErrors(errorsFromRequest(error));
      })
      .finally(() => setBusy(false));
  };

  const another = () => {
    setOutcome(null);
    setValues((current) => ({ ...current, crystal: '', notes: '' }));
  };

  if (outcome) {
    return (
      <Screen title="Log exfoliation" testID="quick-exfoliation-screen">
        {outcome.kind === 'sent' ? (
          <RunLogged step={outcome.step} warnings={outcome.warnings} onAnother={another} />
        ) : (
          <Notice
            tone="warn"
            title="Saved on this device, waiting to sync"
            testID="run-queued"
            action={<Button title="Log another" icon="add" variant="secondary" onPress={another} testID="run-another" />}
          >
            The server could not be reached. The run is kept here and sent as soon as the connection is back; the chips get their
            codes then.
          </Notice>
        )}
      </Screen>
    );
  }

  const oxideChoice = values.substrate !== 'si_sio2' ? null : oxideOther ? 'other' : values.oxideThicknessNm || null;

  return (
    <Screen title="Log exfoliation" lead="One submit logs the run and makes its chips." testID="quick-exfoliation-screen">
      {correcting?.problem ? (
        <Notice tone="error" title="The server refused this run" testID="correcting-problem">
          {correcting.problem.message}
        </Notice>
      ) : null}
      <View style={styles.quick}>
        <Button
          title="Repeat my last run"
          icon="repeat"
          variant="secondary"
          disabled={!lastRun.data?.[0]}
          loading={lastRun.isPending && !lastRun.isError}
          onPress={repeatLast}
          testID="exf-repeat-last"
        />
      </View>
      <TemplatesCard
        type="exfoliation"
        currentBody={{ parameters: exfoliationParameters(values), chipCount: values.chipCount }}
        onApply={(body) => {
          const template = TemplateBody.safeParse(body);
          if (template.success) change(valuesFromStep(template.data.parameters, { chipCount: template.data.chipCount }, values));
        }}
      />

      <Card title="Source crystal">
        {values.crystal ? (
          <View style={styles.chosen}>
            <Text variant="code" tone="primary" testID="exf-crystal">
              {values.crystal}
            </Text>
            <Button
              title="Change"
              variant="quiet"
              icon="swap-horizontal"
              onPress={() => change({ crystal: '' })}
              testID="exf-crystal-change"
            />
          </View>
        ) : (
          <KindPicker
            kind="crystal"
            label="Find the crystal"
            chosen={[]}
            onPick={(sample) => change({ crystal: sample.code })}
            testID="exf-crystal"
          />
        )}
        {(errors.inputs ?? errors['inputs.0.code'] ?? []).map((message) => (
          <Text key={message} tone="danger" variant="caption">
            {message}
          </Text>
        ))}
      </Card>

      <Card title="Run">
        <ChoiceChips
          label="Method"
          choices={METHOD_CHOICES}
          value={values.method}
          onChange={(method) => change({ method })}
          errors={errors['parameters.method']}
          large
          testID="exf-method"
        />
        {tapes.length ? (
          <ChoiceChips
            label="Recent tapes"
            choices={tapes.map((tape) => ({ value: tape, label: tape }))}
            value={values.tapeType || null}
            onChange={(tapeType) => change({ tapeType })}
            testID="exf-tape-recent"
          />
        ) : null}
        <TextField
          label="Tape type (optional)"
          value={values.tapeType}
          onChangeText={(tapeType) => change({ tapeType })}
          errors={errors['parameters.tapeType']}
          autoComplete="off"
          testID="exf-tape"
        />
        <Stepper
          label="Peel cycles"
          value={values.peelCycles}
          min={1}
          max={PEEL_MAX}
          onChange={(peelCycles) => change({ peelCycles })}
          testID="exf-peels"
        />
      </Card>

      <Card title="Substrate">
        <ChoiceChips
          label="Substrate"
          hideLabel
          choices={SUBSTRATE_CHOICES}
          value={values.substrate}
          onChange={(substrate) => change({ substrate })}
          errors={errors['parameters.substrate']}
          large
          testID="exf-substrate"
        />
        {values.substrate === 'si_sio2' ? (
          <>
            <ChoiceChips
              label="Oxide thickness"
              choices={OXIDE_CHOICES}
              value={oxideChoice}
              onChange={(choice) => {
                setOxideOther(choice === 'other');
                change({ oxideThicknessNm: choice === 'other' ? '' : choice });
              }}
              testID="exf-oxide"
            />
            {oxideOther ? (
              <TextField
                label="Oxide thickness (nm)"
                value={values.oxideThicknessNm}
                onChangeText={(oxideThicknessNm) => change({ oxideThicknessNm })}
                errors={errors['parameters.oxideThicknessNm']}
                inputMode="decimal"
                keyboardType="decimal-pad"
                testID="exf-oxide-other"
              />
            ) : null}
          </>
        ) : null}
        <ChoiceChips
          label="Pretreatment"
          choices={PRETREATMENT_CHOICES}
          value={values.pretreatment}
          onChange={(pretreatment) => change({ pretreatment })}
          testID="exf-pretreatment"
        />
        <TextField
          label="Transfer temperature (°C, optional)"
          value={values.transferTemperatureC}
          onChangeText={(transferTemperatureC) => change({ transferTemperatureC })}
          errors={errors['parameters.transferTemperatureC']}
          inputMode="decimal"
          keyboardType="numbers-and-punctuation"
          testID="exf-transfer-temp"
        />
        <Stepper
          label="Chips made"
          value={values.chipCount}
          min={1}
          max={STEP_OUTPUT_COUNT_MAX}
          onChange={(chipCount) => change({ chipCount })}
          testID="exf-chips"
        />
        <TextField
          label="Note (optional)"
          value={values.notes}
          onChangeText={(notes) => change({ notes })}
          multiline
          numberOfLines={2}
          testID="exf-notes"
        />
      </Card>

      <View style={styles.submit}>
        <WarningsNotice warnings={preview} title="Unusual values — check before logging" />
        <FormProblem
          title="Could not log the run"
          error={problem}
          formErrors={Object.keys(errors).length && !problem ? ['Some fields above need attention.'] : []}
        />
        <Button
          title={`Log run and make ${values.chipCount} ${values.chipCount === 1 ? 'chip' : 'chips'}`}
          icon="checkmark"
          block
          loading={busy}
          onPress={submit}
          testID="exf-submit"
        />
      </View>
    </Screen>
  );
}

const styles = StyleSheet.create({
  quick: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  chosen: { flexDirection: 'row', alignItems: 'center', justifyContent: 'space-between', gap: space.md },
  submit: { gap: space.md },
});
