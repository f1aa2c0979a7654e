import { Redirect } from 'expo-router';
import { useRef } from 'react';
import { StyleSheet, View, type TextInput } from 'react-native';
import { SignInInput } from '@/shared/schemas/auth';
import { space } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { LoadingState } from '@/components/ui/state-views';
import { Text } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { TextLink } from '@/components/ui/text-link';
import { describeError } from '@/hooks/api-client';
import { isSignedOutError, useSessionQuery, useSignInMutation } from '@/hooks/use-session';
import { useZodForm } from '@/hooks/use-zod-form';
import { PublicScreen } from './public-screen';

export interface SignInScreenProps {
  /** Where to go once signed in (already checked to be a path on this site). */
  nextPath: string;
}

export function SignInScreen({ nextPath }: SignInScreenProps) {
  const session = useSessionQuery();
  const signIn = useSignInMutation();
  const form = useZodForm(SignInInput, { email: '', password: '' });
  const passwordRef = useRef<TextInput>(null);

  // Signed in already, or just now: the session answer moves the person on.
  if (session.data) return <Redirect href={nextPath} />;

  const submit = () => form.submit((input) => signIn.mutate(input, { onError: form.showServerErrors }));
  // Once a sign-in attempt has failed, its own banner says the same thing; one is enough.
  const sessionTrouble = session.isError && !isSignedOutError(session.error) && !signIn.error;

  return (
    <PublicScreen title="Sign in" lead="Use the e-mail address your lab manager invited." testID="sign-in-screen">
      {session.isPending ? (
        <LoadingState label="Checking whether you are signed in…" />
      ) : (
        <View style={styles.form}>
          {sessionTrouble ? (
            <Notice
              tone="warn"
              action={
                <Button
                  title="Try again"
                  variant="secondary"
                  icon="refresh"
                  loading={session.isFetching}
                  onPress={() => void session.refetch()}
                />
              }
            >
              {describeError(session.error)}
            </Notice>
          ) : null}
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
            returnKeyType="next"
            submitBehavior="submit"
            onSubmitEditing={() => passwordRef.current?.focus()}
            testID="sign-in-email"
          />
          <TextField
            ref={passwordRef}
            label="Password"
            value={form.values.password}
            onChangeText={(text) => form.setValue('password', text)}
            errors={form.errors.password}
            secureTextEntry
            autoComplete="current-password"
            textContentType="password"
            returnKeyType="go"
            onSubmitEditing={submit}
            testID="sign-in-password"
          />
          <FormProblem title="Could not sign you in" error={signIn.error} formErrors={form.formErrors} />
          <Button title="Sign in" block onPress={submit} loading={signIn.isPending} testID="sign-in-submit" />
          <View style={styles.after}>
            <TextLink href="/forgot-password" testID="forgot-password-link">
              Forgot your password?
            </TextLink>
            <Text variant="caption" tone="muted">
              New to the lab? Your lab manager sends you an invitation by e-mail.
            </Text>
          </View>
        </View>
      )}
    </PublicScreen>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  after: { gap: space.xs },
});
