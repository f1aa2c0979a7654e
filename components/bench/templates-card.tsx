import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { StepType } from '@/shared/steps';
import { space } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { FormProblem } from '@/components/ui/form-problem';
import { Text } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { describeError } from '@/hooks/api-client';
import { useDeleteStepTemplateMutation, useSaveStepTemplateMutation, useStepTemplatesQuery } from '@/hooks/use-bench';

export interface TemplatesCardProps {
  type: StepType;
  /** What "Save as template" keeps: the run's settings, never its samples. */
  currentBody: Record<string, unknown>;
  onApply: (body: Record<string, unknown>) => void;
}

/** Saved settings for runs done the same way every week: one tap fills the form. */
export function TemplatesCard({ type, currentBody, onApply }: TemplatesCardProps) {
  const templates = useStepTemplatesQuery(type);
  const save = useSaveStepTemplateMutation();
  const remove = useDeleteStepTemplateMutation();
  const [naming, setNaming] = useState(false);
  const [name, setName] = useState('');
  const [picked, setPicked] = useState<string | null>(null);
  const list = templates.data ?? [];
  const pickedTemplate = list.find((template) => String(template.id) === picked) ?? null;

  return (
    <Card testID="templates-card">
      {list.length ? (
        <ChoiceChips
          label="My templates"
          choices={list.map((template) => ({ value: String(template.id), label: template.name }))}
          value={picked}
          onChange={(id) => {
            setPicked(id);
            const template = list.find((item) => String(item.id) === id);
            if (template) onApply(template.body);
          }}
          testID="template"
        />
      ) : templates.isError ? (
        <Text tone="muted" variant="caption">{`Templates are not available: ${describeError(templates.error)}`}</Text>
      ) : templates.data ? (
        <Text tone="muted" variant="caption">
          No templates yet: fill the form, then save it as one.
        </Text>
      ) : (
        <Text tone="muted" variant="caption">
          Loading templates…
        </Text>
      )}
      {naming ? (
        <View style={styles.naming}>
          <TextField label="Template name" value={name} onChangeText={setName} autoComplete="off" testID="template-name" />
          <View style={styles.row}>
            <Button
              title="Save template"
              icon="bookmark"
              disabled={!name.trim()}
              loading={save.isPending}
              onPress={() =>
                save.mutate(
                  { name: name.trim(), type, body: currentBody },
                  {
                    onSuccess: () => {
                      setNaming(false);
                      setName('');
                    },
                  },
                )
              }
              testID="template-save"
            />
            <Button title="Cancel" variant="quiet" onPress={() => setNaming(false)} />
          </View>
          <FormProblem title="Could not save the template" error={save.error} />
        </View>
      ) : (
        <View style={styles.row}>
          <Button
            title="Save as template"
            icon="bookmark-outline"
            variant="quiet"
            onPress={() => setNaming(true)}
            testID="template-start"
          />
          {pickedTemplate ? (
            <Button
              title={`Delete “${pickedTemplate.name}”`}
              icon="trash-outline"
              variant="quiet"
              loading={remove.isPending}
              onPress={() => remove.mutate(pickedTemplate.id, { onSuccess: () => setPicked(null) })}
              testID="template-delete"
            />
          ) : null}
        </View>
      )}
      <FormProblem title="Could not delete the template" error={remove.error} />
    </Card>
  );
}

const styles = StyleSheet.create({
  naming: { gap: space.sm },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
