import { StyleSheet, View } from 'react-native';
import { space } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { useTakeOutSampleMutation } from '@/hooks/use-storage';

export interface TakeOutConfirmProps {
  code: string;
  /** Where it is now, in words. */
  where: string;
  onDone: () => void;
  onCancel: () => void;
}

/** Asks before taking a sample out of its box (onto the bench, into an instrument). */
export function TakeOutConfirm({ code, where, onDone, onCancel }: TakeOutConfirmProps) {
  const takeOut = useTakeOutSampleMutation();
  return (
    <View style={styles.panel}>
      <Notice tone="warn" title={`Take ${code} out of its box?`} testID="take-out-confirm">
        {`It is in ${where}. Afterwards it shows as not put away until it goes into a box again; its history records the move.`}
      </Notice>
      <FormProblem title="Could not take it out" error={takeOut.error} />
      <View style={styles.actions}>
        <Button
          title="Yes, take it out"
          variant="danger"
          icon="exit-outline"
          loading={takeOut.isPending}
          onPress={() => takeOut.mutate(code, { onSuccess: onDone })}
          testID="take-out-submit"
        />
        <Button title="Leave it there" variant="quiet" onPress={onCancel} testID="take-out-cancel" />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  panel: { gap: space.md, alignSelf: 'stretch' },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
