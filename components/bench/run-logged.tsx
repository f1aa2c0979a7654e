import { StyleSheet, View } from 'react-native';
import type { Step } from '@/shared/schemas/step';
import { SAMPLE_KIND_LABELS } from '@/shared/samples';
import { space } from '@/components/theme';
import { PrintLabelsButton } from '@/components/labels/print-labels';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { TextLink } from '@/components/ui/text-link';
import type { StepWarning } from '@/hooks/use-step-outbox';
import { WarningsNotice } from '@/components/steps/warnings-notice';

export interface RunLoggedProps {
  step: Step;
  warnings: readonly StepWarning[];
  onAnother: () => void;
}

/** After one submit: what was made, with its codes, and the labels to print for it. */
export function RunLogged({ step, warnings, onAnother }: RunLoggedProps) {
  const count = step.outputs.length;
  const kind = step.outputs[0] ? SAMPLE_KIND_LABELS[step.outputs[0].kind].toLowerCase() : 'sample';
  return (
    <Card title={`Logged: ${count} new ${count === 1 ? kind : `${kind}s`}`} testID="run-logged">
      <WarningsNotice warnings={warnings} />
      <View style={styles.codes} testID="run-outputs">
        {step.outputs.map((sample) => (
          <TextLink key={sample.code} href={`/s/${sample.code}`} testID={`run-output-${sample.code}`}>
            {sample.code}
          </TextLink>
        ))}
      </View>
      <View style={styles.actions}>
        <PrintLabelsButton
          target={{ kind: 'step', stepId: step.id }}
          what={`Labels for the ${count} ${count === 1 ? 'sample' : 'samples'} this run made`}
          title="Print their labels"
          variant="primary"
          testID="run-print-labels"
        />
        <Button title="Log another" icon="add" variant="secondary" onPress={onAnother} testID="run-another" />
      </View>
      <TextLink href={`/steps/${step.id}`}>See the full step</TextLink>
    </Card>
  );
}

const styles = StyleSheet.create({
  codes: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
