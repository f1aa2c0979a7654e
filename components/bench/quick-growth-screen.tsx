import { useRef, useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { unusualStepValues } from '@/shared/step-warnings';
import { STEP_OUTPUT_COUNT_MAX, type Step } from '@/shared/schemas/step';
import { STEP_CAUTIONS } from '@/shared/steps';
import { space } from '@/components/theme';
import { canWriteSamples, WritersOnlyState } from '@/components/samples/writers-only';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { errorsFromIssues, errorsFromRequest, type PathErrors } from '@/components/ui/field-errors';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { Text } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { useRegisterPrecursorMutation } from '@/hooks/use-bench';
import { useSessionQuery } from '@/hooks/use-session';
import { newIdempotencyKey, useOutboxItem, useStepOutbox, type StepWarning } from '@/hooks/use-step-outbox';
import { EMPTY_GROWTH, growthFromBody, parseGrowth, type GrowthValues } from './growth-values';
import { KindPicker } from './kind-picker';
import { WarningsNotice } from '@/components/steps/warnings-notice';
import { RunLogged } from './run-logged';
import { Stepper } from './stepper';

const GAS_CHOICES = [
  { value: 'Ar', label: 'Ar' },
  { value: 'N2', label: 'N2' },
];

export function QuickGrowthScreen({ outboxKey }: { outboxKey: string | null }) {
  const session = useSessionQuery();
  if (!canWriteSamples(session.data)) {
    return (
      <Screen title="Log growth" testID="quick-growth-screen">
        <WritersOnlyState task="log runs" role={session.data?.role} />
      </Screen>
    );
  }
  return <QuickGrowthForm outboxKey={outboxKey} />;
}

type Outcome = { kind: 'sent'; step: Step; warnings: readonly StepWarning[] } | { kind: 'queued' } | null;

function QuickGrowthForm({ outboxKey }: { outboxKey: string | null }) {
  const outbox = useStepOutbox();
  const correcting = useOutboxItem(outboxKey);
  const [values, setValues] = useState<GrowthValues>(() => (correcting ? growthFromBody(correcting.body) : EMPTY_GROWTH));
  const [errors, setErrors] = useState<PathErrors>({});
  const [problem, setProblem] = useState<unknown>(null);
  const [busy, setBusy] = useState(false);
  const [outcome, setOutcome] = useState<Outcome>(null);
  const keyRef = useRef<string | null>(null);

  const change = (patch: Partial<GrowthValues>) => {
    keyRef.current = null;
    setValues((current) => ({ ...current, ...patch }));
    setErrors({});
    setProblem(null);
  };
  const toggle = (list: readonly string[], code: string) =>
    list.includes(code) ? list.filter((item) => item !== code) : [...list, code];
  const setZone = (index: 0 | 1 | 2, text: string) => {
    const zones: [string, string, string] = [...values.zones];
    zones[index] = text;
    change({ zones });
  };

  const parsed = parseGrowth(values, new Date());
  const preview = parsed.success ? unusualStepValues(parsed.data) : [];

  const submit = () => {
    if (busy) return;
    const result = parseGrowth(values, new Date());
    if (!result.success) {
      setErrors(errorsFromIssues(result.error.issues));
      return;
    }
    keyRef.current ??= newIdempotencyKey();
    setBusy(true);
    const summary = `CVD growth from ${values.precursors.join(', ')}, ${values.filmCount} ${values.filmCount === 1 ? 'film' : 'films'}`;
    outbox
      .submit({ key: keyRef.current, body: result.data, summary, replaces: correcting?.key ?? null })
      .then((sent) => {
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

  const caution = STEP_CAUTIONS.cvd_growth;
  const fieldErrors = (name: string) => errors[`parameters.${name}`];

  if (outcome) {
    const another = () => setOutcome(null);
    return (
      <Screen title="Log growth" testID="quick-growth-screen">
        {outcome.kind === 'sent' ? (
          <RunLogged step={outcome.step} warnings={outcome.warnings} onAnother={another} />
        ) : (
          <Notice tone="warn" title="Saved on this device, waiting to sync" testID="run-queued">
            The server could not be reached. The run is kept here and sent as soon as the connection is back.
          </Notice>
        )}
      </Screen>
    );
  }

  return (
    <Screen title="Log growth" lead="One submit logs the furnace run and makes its film records." testID="quick-growth-screen">
      {caution ? (
        <Notice tone="warn" title="Caution" testID="growth-caution">
          {caution}
        </Notice>
      ) : null}
      {correcting?.problem ? (
        <Notice tone="error" title="The server refused this run">
          {correcting.problem.message}
        </Notice>
      ) : null}

      <Card title="Precursor lots">
        {values.precursors.length ? (
          <Text variant="code" tone="primary" testID="growth-precursors">
            {values.precursors.join(', ')}
          </Text>
        ) : null}
        {(fieldErrors('precursors') ?? []).map((message) => (
          <Text key={message} tone="danger" variant="caption">
            {message}
          </Text>
        ))}
        <KindPicker
          kind="precursor"
          label="Find a precursor lot"
          chosen={values.precursors}
          onPick={(sample) => change({ precursors: toggle(values.precursors, sample.code) })}
          testID="growth-precursor"
        />
        <RegisterPrecursor onRegistered={(code) => change({ precursors: [...values.precursors, code] })} />
      </Card>

      <Card title="Substrates in the furnace" lead="Optional: chips the film grows on. Leave empty for none.">
        <KindPicker
          kind="chip"
          label="Find a substrate chip"
          chosen={values.substrates}
          onPick={(sample) => change({ substrates: toggle(values.substrates, sample.code) })}
          testID="growth-substrate"
        />
      </Card>

      <Card title="Furnace">
        <View style={styles.zones}>
          {([0, 1, 2] as const).map((index) => (
            <View key={index} style={styles.zone}>
              <TextField
                label={`Zone ${index + 1} (°C)`}
                value={values.zones[index]}
                onChangeText={(text) => setZone(index, text)}
                inputMode="decimal"
                keyboardType="numbers-and-punctuation"
                testID={`growth-zone-${index + 1}`}
              />
            </View>
          ))}
        </View>
        {(fieldErrors('zoneTemperaturesC') ?? []).map((message) => (
          <Text key={message} tone="danger" variant="caption">
            {message}
          </Text>
        ))}
        <TextField
          label="Ramp (°C/min, optional)"
          value={values.rampRateCPerMin}
          onChangeText={(rampRateCPerMin) => change({ rampRateCPerMin })}
          errors={fieldErrors('rampRateCPerMin')}
          inputMode="decimal"
          testID="growth-ramp"
        />
        <TextField
          label="Hold (min)"
          value={values.holdTimeMin}
          onChangeText={(holdTimeMin) => change({ holdTimeMin })}
          errors={fieldErrors('holdTimeMin')}
          inputMode="decimal"
          testID="growth-hold"
        />
        <ChoiceChips
          label="Carrier gas"
          choices={GAS_CHOICES}
          value={GAS_CHOICES.some((gas) => gas.value === values.carrierGas) ? values.carrierGas : null}
          onChange={(carrierGas) => change({ carrierGas })}
          testID="growth-gas"
        />
        <TextField
          label="Carrier gas, if another"
          value={values.carrierGas}
          onChangeText={(carrierGas) => change({ carrierGas })}
          errors={fieldErrors('carrierGas')}
          autoComplete="off"
          testID="growth-gas-text"
        />
        <TextField
          label="Carrier flow (sccm)"
          value={values.carrierFlowSccm}
          onChangeText={(carrierFlowSccm) => change({ carrierFlowSccm })}
          errors={fieldErrors('carrierFlowSccm')}
          inputMode="decimal"
          testID="growth-flow"
        />
        <TextField
          label="H2 flow (sccm, optional)"
          value={values.hydrogenFlowSccm}
          onChangeText={(hydrogenFlowSccm) => change({ hydrogenFlowSccm })}
          errors={fieldErrors('hydrogenFlowSccm')}
          inputMode="decimal"
          testID="growth-h2"
        />
        <TextField
          label="Pressure (Torr)"
          value={values.pressureTorr}
          onChangeText={(pressureTorr) => change({ pressureTorr })}
          errors={fieldErrors('pressureTorr')}
          inputMode="decimal"
          testID="growth-pressure"
        />
      </Card>

      <Card title="Result">
        <TextField
          label="Outcome (optional)"
          value={values.outcome}
          onChangeText={(outcome) => change({ outcome })}
          errors={fieldErrors('outcome')}
          testID="growth-outcome"
        />
        <Stepper
          label="Films made"
          value={values.filmCount}
          min={1}
          max={STEP_OUTPUT_COUNT_MAX}
          onChange={(filmCount) => change({ filmCount })}
          testID="growth-films"
        />
        <TextField
          label="Note (optional)"
          value={values.notes}
          onChangeText={(notes) => change({ notes })}
          multiline
          numberOfLines={2}
          testID="growth-notes"
        />
      </Card>

      <View style={styles.submit}>
        <WarningsNotice warnings={preview} title="Unusual values — check before logging" />
        <FormProblem
          title="Could not log the run"
          error={problem}
          formErrors={Object.keys(errors).length && !problem ? ['Some fields above need attention.'] : []}
        />
        <Button title="Log growth run" icon="checkmark" block loading={busy} onPress={submit} testID="growth-submit" />
      </View>
    </Screen>
  );
}

/** A new bottle or batch registered on the spot, without leaving the run half-logged. */
function RegisterPrecursor({ onRegistered }: { onRegistered: (code: string) => void }) {
  const register = useRegisterPrecursorMutation();
  const [open, setOpen] = useState(false);
  const [material, setMaterial] = useState('');
  const [supplierLot, setSupplierLot] = useState('');
  if (!open) {
    return (
      <Button
        title="Register a new precursor lot"
        icon="add"
        variant="quiet"
        onPress={() => setOpen(true)}
        testID="growth-precursor-new"
      />
    );
  }
  return (
    <View style={styles.register}>
      <TextField
        label="Material (e.g. MoO3, S)"
        value={material}
        onChangeText={setMaterial}
        autoComplete="off"
        testID="precursor-material"
      />
      <TextField
        label="Supplier lot (optional)"
        value={supplierLot}
        onChangeText={setSupplierLot}
        autoComplete="off"
        testID="precursor-lot"
      />
      <View style={styles.row}>
        <Button
          title="Register lot"
          icon="checkmark"
          disabled={!material.trim()}
          loading={register.isPending}
          onPress={() =>
            register.mutate(
              { material: material.trim(), supplierLot: supplierLot.trim() || undefined },
              {
                onSuccess: (sample) => {
                  onRegistered(sample.code);
                  setOpen(false);
                  setMaterial('');
                  setSupplierLot('');
                },
              },
            )
          }
          testID="precursor-register"
        />
        <Button title="Cancel" variant="quiet" onPress={() => setOpen(false)} />
      </View>
      <FormProblem title="Could not register the lot" error={register.error} />
    </View>
  );
}

const styles = StyleSheet.create({
  zones: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  zone: { flexGrow: 1, flexBasis: 100 },
  register: { gap: space.sm },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  submit: { gap: space.md },
});
