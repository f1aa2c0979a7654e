import { StyleSheet, View } from 'react-native';
import { ResetPasswordInput } from '@/shared/schemas/auth';
import { PASSWORD_MIN_LENGTH } from '@/shared/schemas/limits';
import { space } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { TextField } from '@/components/ui/text-field';
import { TextLink } from '@/components/ui/text-link';
import { isWellFormedLinkToken, useResetPasswordMutation } from '@/hooks/use-password-links';
import { useZodForm } from '@/hooks/use-zod-form';
import { isLinkProblem, LinkProblem } from './link-problem';
import { PublicScreen } from './public-screen';

const NEW_LINK = {
  nextStep: 'You can ask for a new link; it is valid for a limited time and works once.',
  nextHref: '/forgot-password',
  nextLabel: 'Ask for a new link',
} as const;

export function ResetPasswordScreen({ token }: { token: string | undefined }) {
  const reset = useResetPasswordMutation();
  const form = useZodForm(ResetPasswordInput, { password: '' });
  const submit = () => form.submit((input) => reset.mutate(input, { onError: form.showServerErrors }), { token });

  return (
    <PublicScreen title="Choose a new password" testID="reset-password-screen">
      {!isWellFormedLinkToken(token) ? (
        <LinkProblem error={null} {...NEW_LINK} />
      ) : isLinkProblem(reset.error) ? (
        <LinkProblem error={reset.error} {...NEW_LINK} />
      ) : reset.isSuccess ? (
        <View style={styles.stack}>
          <Notice tone="success" title="Password changed" testID="reset-password-done">
            {reset.data.message}
          </Notice>
          <TextLink href="/sign-in">Sign in with the new password</TextLink>
        </View>
      ) : (
        <View style={styles.stack}>
          <TextField
            label="New password"
            hint={`At least ${PASSWORD_MIN_LENGTH} characters. Other devices signed in to your account will be signed out.`}
            value={form.values.password}
            onChangeText={(text) => form.setValue('password', text)}
            errors={form.errors.password}
            secureTextEntry
            autoComplete="new-password"
            textContentType="newPassword"
            returnKeyType="done"
            onSubmitEditing={submit}
            testID="reset-password-new"
          />
          <FormProblem title="Could not change your password" error={reset.error} formErrors={form.formErrors} />
          <Button title="Save new password" block onPress={submit} loading={reset.isPending} testID="reset-password-submit" />
        </View>
      )}
    </PublicScreen>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.lg },
});
