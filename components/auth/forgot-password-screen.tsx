import { StyleSheet, View } from 'react-native';
import { ForgotPasswordInput } from '@/shared/schemas/auth';
import { space } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { TextField } from '@/components/ui/text-field';
import { TextLink } from '@/components/ui/text-link';
import { useForgotPasswordMutation } from '@/hooks/use-password-links';
import { useZodForm } from '@/hooks/use-zod-form';
import { PublicScreen } from './public-screen';

export function ForgotPasswordScreen() {
  const request = useForgotPasswordMutation();
  const form = useZodForm(ForgotPasswordInput, { email: '' });
  const submit = () => form.submit((input) => request.mutate(input, { onError: form.showServerErrors }));

  return (
    <PublicScreen
      title="Forgot your password?"
      lead="We will e-mail you a link to choose a new one."
      testID="forgot-password-screen"
    >
      {request.isSuccess ? (
        <View style={styles.stack}>
          <Notice tone="success" title="Check your e-mail" testID="forgot-password-sent">
            {request.data.message}
            No e-mail after a few minutes? Check the address, or ask your lab manager: in labs without a mail server they can find
            the link in the Flakeline outbox.
          </Notice>
          <View style={styles.links}>
            <TextLink href="/sign-in">Back to sign in</TextLink>
            <Button title="Use another address" variant="quiet" onPress={() => request.reset()} />
          </View>
        </View>
      ) : (
        <View style={styles.stack}>
          <TextField
            label="E-mail"
            value={form.values.email}
            onChangeText={(text) => form.setValue('email', text)}
            errors={form.errors.email}
            keyboardType="email-address"
            inputMode="email"
            autoComplete="email"
            textContentType="username"
            autoCapitalize="none"
            autoCorrect={false}
            returnKeyType="send"
            onSubmitEditing={submit}
            testID="forgot-password-email"
          />
          <FormProblem title="Could not send the link" error={request.error} formErrors={form.formErrors} />
          <Button title="Send reset link" block onPress={submit} loading={request.isPending} testID="forgot-password-submit" />
          <TextLink href="/sign-in">Back to sign in</TextLink>
        </View>
      )}
    </PublicScreen>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.lg },
  links: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.lg },
});
