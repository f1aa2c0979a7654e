import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { LabSettingsUpdateInput, type LabSettings } from '@/shared/schemas/device';
import { formatNumber } from '@/shared/zone-plate';
import { space } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { formatDateTime } from '@/components/ui/format';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { Text } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { useUpdateLabSettingsMutation } from '@/hooks/use-lab-settings';

export interface LabLithographySettingProps {
  settings: LabSettings;
  /** Managers may change it; everyone else reads it. */
  canEdit: boolean;
}

/** The smallest line the lab's lithography writes: what every lens design is warned against. */
export function LabLithographySetting({ settings, canEdit }: LabLithographySettingProps) {
  const [editing, setEditing] = useState(false);
  const source = settings.isDefault
    ? 'Flakeline’s default until a lab manager sets your process’s value.'
    : `Set by ${settings.updatedBy?.displayName ?? 'a lab manager'}${settings.updatedAt ? ` on ${formatDateTime(settings.updatedAt)}` : ''}.`;
  return (
    <View style={styles.stack} testID="lab-min-feature">
      <Text>
        {`Your lab’s lithography writes lines down to `}
        <Text variant="label" testID="lab-min-feature-value">{`${formatNumber(settings.minFeatureNm)} nm`}</Text>
        {'. '}
        <Text tone="muted">{source}</Text>
      </Text>
      {canEdit && !editing ? (
        <Button
          title="Change the lab’s smallest feature"
          variant="quiet"
          icon="create-outline"
          onPress={() => setEditing(true)}
          testID="lab-min-feature-edit"
        />
      ) : null}
      {canEdit && editing ? <EditMinFeature current={settings.minFeatureNm} onDone={() => setEditing(false)} /> : null}
    </View>
  );
}

function EditMinFeature({ current, onDone }: { current: number; onDone: () => void }) {
  const update = useUpdateLabSettingsMutation();
  const [text, setText] = useState(String(current));
  const [errors, setErrors] = useState<string[]>([]);

  const save = () => {
    const typed = text.trim().replace(',', '.');
    const parsed = LabSettingsUpdateInput.safeParse({ minFeatureNm: typed === '' ? undefined : Number(typed) });
    if (!parsed.success) {
      setErrors(parsed.error.issues.map((issue) => issue.message));
      return;
    }
    update.mutate(parsed.data, { onSuccess: onDone, onError: () => setErrors([]) });
  };

  return (
    <View style={styles.stack}>
      <TextField
        label="Smallest feature the lithography writes (nm)"
        hint="The narrowest line your e-beam exposure and etch reliably make in a flake. Every lens design is checked against it."
        value={text}
        onChangeText={(next) => {
          setText(next);
          setErrors([]);
        }}
        inputMode="decimal"
        keyboardType="decimal-pad"
        errors={errors}
        onSubmitEditing={save}
        testID="lab-min-feature-input"
      />
      <FormProblem title="Could not save the setting" error={update.error} />
      {update.isSuccess ? <Notice tone="success">Saved for the whole lab.</Notice> : null}
      <View style={styles.actions}>
        <Button title="Save for the lab" onPress={save} loading={update.isPending} testID="lab-min-feature-save" />
        <Button title="Cancel" variant="quiet" onPress={onDone} />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.sm },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
