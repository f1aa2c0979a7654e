import { useRouter } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { SampleKind } from '@/shared/samples';
import { SampleCreateInput, SampleUpdateInput, type Sample } from '@/shared/schemas/sample';
import { space } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { errorsFromIssues, errorsFromRequest, partitionErrors, type PathErrors } from '@/components/ui/field-errors';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { ErrorState, LoadingState } from '@/components/ui/state-views';
import { Text } from '@/components/ui/text';
import { describeError, isApiError } from '@/hooks/api-client';
import { useBreakpoints } from '@/hooks/use-breakpoints';
import { isStaleSampleError, useCreateSampleMutation, useSampleQuery, useUpdateSampleMutation } from '@/hooks/use-samples';
import { useSessionQuery } from '@/hooks/use-session';
import { changeLines } from './history-events';
import { fieldLabelWithUnit, propertyField } from './property-fields';
import { SampleFields, sampleFieldKeys } from './sample-fields';
import {
  blankSampleValues,
  changedKeys,
  createCandidate,
  rebaseValues,
  recordChanges,
  sampleValues,
  updateCandidate,
  type SampleFormValues,
} from './sample-form-values';
import { sampleHref } from './sample-list-params';
import { canWriteSamples, WritersOnlyState } from './writers-only';

/** Form state with its messages: a field's message goes once that field is changed. */
function useSampleFormState(initial: () => SampleFormValues) {
  const [values, setValues] = useState(initial);
  const [errors, setErrors] = useState<PathErrors>({});
  const change = (next: SampleFormValues) => {
    const changed = changedKeys(values, next);
    setValues(next);
    if (changed.some((key) => errors[key])) {
      setErrors(Object.fromEntries(Object.entries(errors).filter(([key]) => !changed.includes(key))));
    }
  };
  const { placed, rest } = partitionErrors(errors, (key) => sampleFieldKeys(values.kind).includes(key));
  return { values, setValues, change, setErrors, placed, rest };
}

function useLeave() {
  const router = useRouter();
  return (fallback: Parameters<typeof router.replace>[0]) => (router.canGoBack() ? router.back() : router.replace(fallback));
}

export function NewSampleScreen({ initialKind }: { initialKind: SampleKind | null }) {
  const session = useSessionQuery();
  const router = useRouter();
  const leave = useLeave();
  const { isWide } = useBreakpoints();
  const create = useCreateSampleMutation();
  const form = useSampleFormState(() => blankSampleValues(initialKind));

  if (!canWriteSamples(session.data)) {
    return (
      <Screen title="New sample" testID="new-sample-screen">
        <WritersOnlyState task="register samples" role={session.data?.role} />
      </Screen>
    );
  }

  const submit = () => {
    const parsed = SampleCreateInput.safeParse(createCandidate(form.values));
    if (!parsed.success) {
      form.setErrors(errorsFromIssues(parsed.error.issues));
      return;
    }
    form.setErrors({});
    create.mutate(parsed.data, {
      onSuccess: (sample) => router.replace(sampleHref(sample.code, { wide: isWide })),
      onError: (error) => form.setErrors(errorsFromRequest(error)),
    });
  };

  return (
    <Screen
      title="New sample"
      lead="Register something that did not come from a logged step: a bought crystal, a fresh substrate, a film from elsewhere. Samples made at the bench come from logging the step."
      testID="new-sample-screen"
    >
      <Card>
        <SampleFields mode="create" values={form.values} onChange={form.change} errors={form.placed} />
        <FormProblem title="Could not save the sample" error={create.error} formErrors={form.rest} />
        <FieldsNeedAttention show={Object.keys(form.placed).length > 0 && !create.error} />
        <View style={styles.actions}>
          <Button title="Save sample" icon="checkmark" onPress={submit} loading={create.isPending} testID="sample-save" />
          <Button title="Cancel" variant="quiet" onPress={() => leave('/samples')} testID="sample-cancel" />
        </View>
      </Card>
    </Screen>
  );
}

export function EditSampleScreen({ code }: { code: string }) {
  const session = useSessionQuery();
  const sample = useSampleQuery(code);
  const title = `Edit ${sample.data?.code ?? code}`;

  if (!canWriteSamples(session.data)) {
    return (
      <Screen title={title} testID="edit-sample-screen">
        <WritersOnlyState task="edit samples" role={session.data?.role} />
      </Screen>
    );
  }

  return (
    <Screen title={title} testID="edit-sample-screen">
      {sample.data ? (
        sample.data.status === 'retired' ? (
          <Notice tone="warn" title={`${sample.data.code} is retired`}>
            Retired records are kept as they are. Its history and links can still be read.
          </Notice>
        ) : (
          <EditSampleForm key={sample.data.code} initial={sample.data} />
        )
      ) : isApiError(sample.error, 'not_found', 'code_typo') ? (
        <Notice tone="warn" title="No such sample" testID="sample-missing">
          {describeError(sample.error)}
        </Notice>
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

/**
 * Edits start from the version that was opened. If someone saved in between, the server refuses
 * (409); the form then shows what they changed and lets the person re-apply their own edit on
 * top, or take the record as it is now.
 */
function EditSampleForm({ initial }: { initial: Sample }) {
  const leave = useLeave();
  const { isWide } = useBreakpoints();
  const update = useUpdateSampleMutation();
  const [base, setBase] = useState(initial);
  const form = useSampleFormState(() => sampleValues(initial));
  const current = isStaleSampleError(update.error) ? update.error.current : null;

  const save = (from: Sample, values: SampleFormValues = form.values) => {
    const parsed = SampleUpdateInput.safeParse(updateCandidate(values, from));
    if (!parsed.success) {
      form.setErrors(errorsFromIssues(parsed.error.issues));
      return;
    }
    form.setErrors({});
    update.mutate(
      { code: from.code, changes: parsed.data },
      {
        onSuccess: (saved) => leave(sampleHref(saved.code, { wide: isWide })),
        onError: (error) => form.setErrors(errorsFromRequest(error)),
      },
    );
  };

  const reapply = (now: Sample) => {
    const { values } = rebaseValues(form.values, base, now);
    form.setValues(values);
    setBase(now);
    save(now, values);
  };

  const takeTheirs = (now: Sample) => {
    setBase(now);
    form.setValues(sampleValues(now));
    form.setErrors({});
    update.reset();
  };

  return (
    <Card>
      <SampleFields mode="edit" values={form.values} onChange={form.change} errors={form.placed} />
      {current ? (
        <StaleNotice
          base={base}
          current={current}
          bothChanged={rebaseValues(form.values, base, current).bothChanged}
          onReapply={() => reapply(current)}
          onTakeTheirs={() => takeTheirs(current)}
        />
      ) : (
        <>
          <FormProblem title="Could not save the changes" error={update.error} formErrors={form.rest} />
          <FieldsNeedAttention show={Object.keys(form.placed).length > 0 && !update.error} />
        </>
      )}
      <View style={styles.actions}>
        <Button
          title="Save sample"
          icon="checkmark"
          onPress={() => save(base)}
          loading={update.isPending}
          disabled={current !== null}
          testID="sample-save"
        />
        <Button
          title="Cancel"
          variant="quiet"
          onPress={() => leave(sampleHref(base.code, { wide: isWide }))}
          testID="sample-cancel"
        />
      </View>
    </Card>
  );
}

/** Beside the button: a long form's messages may be out of sight above. */
function FieldsNeedAttention({ show }: { show: boolean }) {
  return show ? (
    <Text tone="danger" accessibilityLiveRegion="polite" testID="sample-fix-fields">
      Some fields above need attention.
    </Text>
  ) : null;
}

interface StaleNoticeProps {
  base: Sample;
  current: Sample;
  /** Fields both people changed (dotted paths); the person's own value would win there. */
  bothChanged: string[];
  onReapply: () => void;
  onTakeTheirs: () => void;
}

function fieldName(key: string): string {
  const name = key.replace(/^properties\./, '');
  const field = propertyField(name);
  return field ? fieldLabelWithUnit(field).toLowerCase() : name;
}

function StaleNotice({ base, current, bothChanged, onReapply, onTakeTheirs }: StaleNoticeProps) {
  const lines = changeLines(recordChanges(base, current));
  if (current.status === 'retired') {
    return (
      <Notice tone="warn" title={`${current.code} was retired while you were editing`} testID="sample-stale">
        {`Retired records are kept as they are${current.retiredReason ? `. Reason: ${current.retiredReason}` : ''}.`}
      </Notice>
    );
  }
  return (
    <Notice
      tone="warn"
      title={`Someone changed ${current.code} while you were editing`}
      testID="sample-stale"
      action={
        <>
          <Button title="Re-apply my changes" onPress={onReapply} testID="sample-reapply" />
          <Button title="Use their version" variant="secondary" onPress={onTakeTheirs} testID="sample-take-theirs" />
        </>
      }
    >
      {`It is now version ${current.version}${lines.length ? '. What changed meanwhile:' : ', with no visible differences.'}`}
      {lines.map((line) => (
        <Text key={line} variant="code">
          {line}
        </Text>
      ))}
      {bothChanged.length
        ? `You both changed ${bothChanged.map(fieldName).join(', ')}: re-applying keeps your value there and their changes everywhere else.`
        : 'Re-applying puts your changes on top of theirs; their other changes are kept.'}
    </Notice>
  );
}

const styles = StyleSheet.create({
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
