import { useState } from 'react';
import { ChangePasswordInput } from '@/shared/schemas/auth';
import { PASSWORD_MIN_LENGTH } from '@/shared/schemas/limits';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { TextField } from '@/components/ui/text-field';
import { isApiError } from '@/hooks/api-client';
import { useChangePasswordMutation } from '@/hooks/use-account';
import { useZodForm } from '@/hooks/use-zod-form';

const WRONG_CURRENT = 'That is not your current password.';

export function ChangePasswordCard() {
  const change = useChangePasswordMutation();
  const form = useZodForm(ChangePasswordInput, { currentPassword: '', newPassword: '' });
  const [done, setDone] = useState<string | null>(null);

  const submit = () =>
    form.submit((input) => {
      setDone(null);
      change.mutate(input, {
        onSuccess: ({ message }) => {
          form.reset();
          setDone(message);
        },
        onError: form.showServerErrors,
      });
    });

  // The server's wording is written for sign-in; here the only thing that can be wrong is the current password.
  const wrongCurrent = isApiError(change.error, 'invalid_credentials');

  const edit = (name: 'currentPassword' | 'newPassword', text: string) => {
    setDone(null);
    if (wrongCurrent && name === 'currentPassword') change.reset();
    form.setValue(name, text);
  };

  return (
    <Card title="Password" lead="Choose one you do not use anywhere else." testID="account-password">
      <TextField
        label="Current password"
        value={form.values.currentPassword}
        onChangeText={(text) => edit('currentPassword', text)}
        errors={form.errors.currentPassword ?? (wrongCurrent ? [WRONG_CURRENT] : undefined)}
        secureTextEntry
        autoComplete="current-password"
        textContentType="password"
        testID="account-current-password"
      />
      <TextField
        label="New password"
        hint={`At least ${PASSWORD_MIN_LENGTH} characters.`}
        value={form.values.newPassword}
        onChangeText={(text) => edit('newPassword', text)}
        errors={form.errors.newPassword}
        secureTextEntry
        autoComplete="new-password"
        textContentType="newPassword"
        returnKeyType="done"
        onSubmitEditing={submit}
        testID="account-new-password"
      />
      {done ? <Notice tone="success">{done}</Notice> : null}
      <FormProblem
        title="Could not change your password"
        error={wrongCurrent ? null : change.error}
        formErrors={form.formErrors}
      />
      <Button
        title="Change password"
        variant="secondary"
        onPress={submit}
        loading={change.isPending}
        testID="account-change-password"
      />
    </Card>
  );
}
