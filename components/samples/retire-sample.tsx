import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { RETIREMENT_REASON_MAX_LENGTH, RetireSampleInput, type Sample } from '@/shared/schemas/sample';
import { space } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { errorsFromIssues, errorsFromRequest, type PathErrors } from '@/components/ui/field-errors';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { TextField } from '@/components/ui/text-field';
import { isStaleSampleError, useRetireSampleMutation } from '@/hooks/use-samples';

/** Opens the retirement panel below a record's actions. */
export function RetireSampleButton({ onPress }: { onPress: () => void }) {
  return <Button title="Retire" variant="quiet" icon="archive-outline" onPress={onPress} testID="sample-retire" />;
}

/**
 * A lab manager withdraws a record with a reason. Nothing is deleted: the record, its links and
 * its history stay readable, marked retired.
 */
export function RetireSamplePanel({ sample, onClose }: { sample: Sample; onClose: () => void }) {
  const retire = useRetireSampleMutation();
  const [reason, setReason] = useState('');
  const [errors, setErrors] = useState<PathErrors>({});

  const submit = () => {
    const parsed = RetireSampleInput.safeParse({ version: sample.version, reason });
    if (!parsed.success) {
      setErrors(errorsFromIssues(parsed.error.issues));
      return;
    }
    setErrors({});
    retire.mutate(
      { code: sample.code, input: parsed.data },
      { onSuccess: onClose, onError: (error) => setErrors(errorsFromRequest(error)) },
    );
  };

  const stale = isStaleSampleError(retire.error);

  return (
    <View style={styles.panel}>
      <Notice tone="warn" title={`Retire ${sample.code}?`} testID="sample-retire-confirm">
        It stays in Flakeline with its links and history, marked retired, and can no longer be used in steps or edited.
      </Notice>
      <TextField
        label="Reason"
        hint="People reading the history later will see this."
        value={reason}
        onChangeText={(text) => {
          setReason(text);
          setErrors({});
        }}
        errors={errors.reason}
        maxLength={RETIREMENT_REASON_MAX_LENGTH}
        multiline
        testID="sample-retire-reason"
      />
      <FormProblem title={stale ? 'The record changed meanwhile' : 'Could not retire the record'} error={retire.error} />
      <View style={styles.actions}>
        <Button title="Yes, retire" variant="danger" onPress={submit} loading={retire.isPending} testID="sample-retire-submit" />
        <Button title="Keep it" variant="quiet" onPress={onClose} testID="sample-retire-cancel" />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  panel: { gap: space.md, alignSelf: 'stretch' },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
