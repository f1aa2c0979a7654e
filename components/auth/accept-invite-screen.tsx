import { useRouter } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { ROLE_LABELS, ROLE_SUMMARIES } from '@/shared/roles';
import { AcceptInvitationInput, type InvitationPreview } from '@/shared/schemas/auth';
import { PASSWORD_MIN_LENGTH } from '@/shared/schemas/limits';
import { space } from '@/components/theme';
import { LAB_HOME } from '@/hooks/use-next-path';
import { RoleBadge } from '@/components/ui/badges';
import { Button } from '@/components/ui/button';
import { DetailRow } from '@/components/ui/detail-row';
import { FormProblem } from '@/components/ui/form-problem';
import { ErrorState, LoadingState } from '@/components/ui/state-views';
import { Text } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { isWellFormedLinkToken, useAcceptInvitationMutation, useInvitationPreviewQuery } from '@/hooks/use-password-links';
import { useZodForm } from '@/hooks/use-zod-form';
import { isLinkProblem, LinkProblem } from './link-problem';
import { PublicScreen } from './public-screen';

const ASK_AGAIN = {
  nextStep: 'Ask your lab manager to send you a new invitation. If you already joined, sign in instead.',
  nextHref: '/sign-in',
  nextLabel: 'Go to sign in',
} as const;

type Acceptance = ReturnType<typeof useAcceptInvitationMutation>;

export function AcceptInviteScreen({ token }: { token: string | undefined }) {
  const router = useRouter();
  const accept = useAcceptInvitationMutation();
  // Once accepted, the link is spent; asking about it again would only report "already used".
  const preview = useInvitationPreviewQuery(token, { enabled: accept.isIdle || accept.isError });

  return (
    <PublicScreen title="Join your lab on Flakeline" testID="accept-invite-screen">
      {!isWellFormedLinkToken(token) ? (
        <LinkProblem error={null} {...ASK_AGAIN} />
      ) : accept.isSuccess ? (
        <LoadingState label="Setting up your account…" />
      ) : isLinkProblem(preview.error) ? (
        <LinkProblem error={preview.error} {...ASK_AGAIN} />
      ) : isLinkProblem(accept.error) ? (
        <LinkProblem error={accept.error} {...ASK_AGAIN} />
      ) : preview.data ? (
        <InvitationForm token={token} invitation={preview.data} accept={accept} onAccepted={() => router.replace(LAB_HOME)} />
      ) : preview.isError ? (
        <ErrorState
          title="Could not open the invitation"
          error={preview.error}
          onRetry={() => void preview.refetch()}
          retrying={preview.isFetching}
        />
      ) : (
        <LoadingState label="Opening your invitation…" />
      )}
    </PublicScreen>
  );
}

interface InvitationFormProps {
  token: string;
  invitation: InvitationPreview;
  accept: Acceptance;
  onAccepted: () => void;
}

function InvitationForm({ token, invitation, accept, onAccepted }: InvitationFormProps) {
  const form = useZodForm(AcceptInvitationInput, { displayName: invitation.displayName, password: '' });

  const submit = () =>
    form.submit(
      (input) =>
        accept.mutate(input, {
          onSuccess: onAccepted,
          onError: form.showServerErrors,
        }),
      { token },
    );

  return (
    <View style={styles.stack}>
      <DetailRow label="Invited as" testID="invite-role">
        <View style={styles.role}>
          <RoleBadge role={invitation.role} />
          <Text tone="muted">{ROLE_SUMMARIES[invitation.role]}</Text>
        </View>
      </DetailRow>
      <DetailRow label="E-mail" testID="invite-email">
        {invitation.email}
      </DetailRow>
      <TextField
        label="Name"
        hint="How colleagues see you on samples, runs and the audit trail."
        value={form.values.displayName}
        onChangeText={(text) => form.setValue('displayName', text)}
        errors={form.errors.displayName}
        autoComplete="name"
        textContentType="name"
        testID="invite-name"
      />
      <TextField
        label="Password"
        hint={`Choose one of at least ${PASSWORD_MIN_LENGTH} characters.`}
        value={form.values.password}
        onChangeText={(text) => form.setValue('password', text)}
        errors={form.errors.password}
        secureTextEntry
        autoComplete="new-password"
        textContentType="newPassword"
        returnKeyType="done"
        onSubmitEditing={submit}
        testID="invite-password"
      />
      <FormProblem title="Could not accept the invitation" error={accept.error} formErrors={form.formErrors} />
      <Button
        title="Accept invitation"
        accessibilityHint={`Joins as ${ROLE_LABELS[invitation.role]}`}
        block
        onPress={submit}
        loading={accept.isPending}
        testID="invite-accept"
      />
    </View>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.lg },
  role: { gap: space.xs },
});
