import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { ROLE_SUMMARIES } from '@/shared/roles';
import { AccountUpdateInput } from '@/shared/schemas/auth';
import type { User } from '@/shared/schemas/user';
import { space } from '@/components/theme';
import { RoleBadge } from '@/components/ui/badges';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { DetailRow } from '@/components/ui/detail-row';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { Text } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { useUpdateAccountMutation } from '@/hooks/use-account';
import { useZodForm } from '@/hooks/use-zod-form';

export function ProfileCard({ user }: { user: User }) {
  const update = useUpdateAccountMutation();
  const form = useZodForm(AccountUpdateInput, { displayName: user.displayName });
  const [saved, setSaved] = useState(false);
  const unchanged = form.values.displayName.trim() === user.displayName;

  const save = () =>
    form.submit((input) => {
      setSaved(false);
      update.mutate(input, {
        onSuccess: (updated) => {
          form.reset({ displayName: updated.displayName });
          setSaved(true);
        },
        onError: form.showServerErrors,
      });
    });

  return (
    <Card title="Profile" testID="account-profile">
      <TextField
        label="Name"
        hint="How colleagues see you on samples, runs and the audit trail."
        value={form.values.displayName}
        onChangeText={(text) => {
          setSaved(false);
          form.setValue('displayName', text);
        }}
        errors={form.errors.displayName}
        autoComplete="name"
        textContentType="name"
        returnKeyType="done"
        onSubmitEditing={save}
        testID="account-name"
      />
      {saved ? <Notice tone="success">Name saved.</Notice> : null}
      <FormProblem title="Could not save your name" error={update.error} formErrors={form.formErrors} />
      <Button
        title="Save name"
        variant="secondary"
        onPress={save}
        loading={update.isPending}
        disabled={unchanged}
        testID="account-save-name"
      />
      <View style={styles.details}>
        <DetailRow label="E-mail" testID="account-email">
          {user.email}
        </DetailRow>
        <DetailRow label="Role" testID="account-role">
          <View style={styles.role}>
            <RoleBadge role={user.role} />
            <Text tone="muted">{ROLE_SUMMARIES[user.role]}</Text>
          </View>
        </DetailRow>
      </View>
    </Card>
  );
}

const styles = StyleSheet.create({
  details: { gap: space.lg, paddingTop: space.sm },
  role: { gap: space.xs },
});
