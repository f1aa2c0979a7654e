import { StyleSheet, View } from 'react-native';
import type { AuditReport, AuditStep } from '@/shared/schemas/audit';
import { fieldLabel, formatParameter, isStepType, stepFields } from '@/components/steps/step-fields';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { Card } from '@/components/ui/card';
import { DetailRow } from '@/components/ui/detail-row';
import { formatDateTime } from '@/components/ui/format';
import { Text } from '@/components/ui/text';
import { StepRef, type AuditReach } from './audit-refs';

/** A parameter's label and value in the lab's words where the step type is known. */
function parameterLines(step: AuditStep): { name: string; label: string; value: string }[] {
  const fields = isStepType(step.type) ? stepFields(step.type) : [];
  return Object.entries(step.parameters).map(([name, value]) => {
    const field = fields.find((candidate) => candidate.name === name);
    return { name, label: field ? fieldLabel(field) : name, value: formatParameter(field, value) };
  });
}

/** Every step in the ancestry: who, when, with what, and what went in and came out. */
export function AuditSteps({ audit, reach }: { audit: AuditReport; reach: AuditReach }) {
  return (
    <Card title="Steps" lead="Who did each step, when, on which instrument and with which settings." testID="audit-steps">
      {audit.steps.length === 0 ? <Text tone="muted">No logged steps: every record here was registered directly.</Text> : null}
      {audit.steps.map((step) => (
        <StepBlock key={step.id} step={step} reach={reach} />
      ))}
    </Card>
  );
}

function StepBlock({ step, reach }: { step: AuditStep; reach: AuditReach }) {
  const { colors } = useTheme();
  const when = step.startedAt
    ? `${formatDateTime(step.startedAt)}${step.endedAt ? ` – ${formatDateTime(step.endedAt)}` : ''}`
    : 'No start time recorded';
  return (
    <View style={[styles.step, { borderColor: colors.hairline }]} testID={`audit-step-${step.id}`}>
      <StepRef id={step.id} label={`${step.label} · step ${step.id}`} reach={reach} />
      <View style={styles.facts}>
        <DetailRow label="Operator">{step.operator?.displayName ?? 'No operator recorded'}</DetailRow>
        <DetailRow label="When">{when}</DetailRow>
        <DetailRow label="Instrument">{step.instrument ?? '—'}</DetailRow>
      </View>
      <Text variant="caption">{`${step.inputCodes.join(', ') || 'nothing'} → ${step.outputCodes.join(', ') || 'treated in place'}`}</Text>
      {parameterLines(step).length > 0 ? (
        <View style={styles.parameters}>
          {parameterLines(step).map((line) => (
            <Text key={line.name} variant="caption">
              <Text variant="caption" tone="muted">{`${line.label}: `}</Text>
              {line.value}
            </Text>
          ))}
        </View>
      ) : null}
      {step.notes ? <Text variant="caption">{step.notes}</Text> : null}
    </View>
  );
}

const styles = StyleSheet.create({
  step: { borderWidth: sizes.hairline, borderRadius: radii.md, padding: space.md, gap: space.sm },
  facts: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.xl, rowGap: space.sm },
  parameters: { gap: space.xxs },
});
