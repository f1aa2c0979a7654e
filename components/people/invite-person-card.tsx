import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { ROLE_LABELS, ROLE_SUMMARIES, ROLES, type Role } from '@/shared/roles';
import { InviteUserInput } from '@/shared/schemas/user';
import { space } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceGroup, type Choice } from '@/components/ui/choice-group';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { TextField } from '@/components/ui/text-field';
import { useInviteUserMutation } from '@/hooks/use-users';
import { useZodForm } from '@/hooks/use-zod-form';

export const ROLE_CHOICES: readonly Choice<Role>[] = ROLES.map((role) => ({
  value: role,
  label: ROLE_LABELS[role],
  description: ROLE_SUMMARIES[role],
}));

const BLANK = { email: '', displayName: '', role: 'researcher' };

function isRole(value: string): value is Role {
  return ROLES.some((role) => role === value);
}

/** Invite a colleague by e-mail: they get a link to choose their own password. */
export function InvitePersonCard() {
  const [open, setOpen] = useState(false);
  const [sentTo, setSentTo] = useState<string | null>(null);
  const invite = useInviteUserMutation();
  const form = useZodForm(InviteUserInput, BLANK);

  const submit = () =>
    form.submit((input) =>
      invite.mutate(input, {
        onSuccess: (person) => {
          setSentTo(person.email);
          form.reset();
          setOpen(false);
        },
        onError: form.showServerErrors,
      }),
    );

  const sent = sentTo ? (
    <Notice tone="success" title="Invitation sent" testID="invite-sent">
      {`${sentTo} has been invited and appears in the list below. In a lab without a mail server, the e-mail with the link is in the Outbox.`}
    </Notice>
  ) : null;

  if (!open) {
    return (
      <View style={styles.closed}>
        {sent}
        <Button
          title="Invite someone"
          icon="person-add-outline"
          onPress={() => {
            setSentTo(null);
            invite.reset();
            setOpen(true);
          }}
          testID="invite-open"
        />
      </View>
    );
  }

  return (
    <Card title="Invite someone" lead="They get an e-mail with a link to choose their password." testID="invite-card">
      <TextField
        label="E-mail"
        value={form.values.email}
        onChangeText={(text) => form.setValue('email', text)}
        errors={form.errors.email}
        keyboardType="email-address"
        inputMode="email"
        autoComplete="off"
        autoCapitalize="none"
        autoCorrect={false}
        testID="invite-email"
      />
      <TextField
        label="Name"
        value={form.values.displayName}
        onChangeText={(text) => form.setValue('displayName', text)}
        errors={form.errors.displayName}
        autoComplete="off"
        hint="They can change it after joining."
        testID="invite-display-name"
      />
      <ChoiceGroup
        label="Role"
        choices={ROLE_CHOICES}
        value={isRole(form.values.role) ? form.values.role : null}
        onChange={(role) => form.setValue('role', role)}
        errors={form.errors.role}
        testID="invite-role"
      />
      <FormProblem title="Could not send the invitation" error={invite.error} formErrors={form.formErrors} />
      <View style={styles.actions}>
        <Button title="Send invitation" onPress={submit} loading={invite.isPending} testID="invite-submit" />
        <Button
          title="Cancel"
          variant="quiet"
          onPress={() => {
            form.reset();
            invite.reset();
            setOpen(false);
          }}
        />
      </View>
    </Card>
  );
}

const styles = StyleSheet.create({
  closed: { gap: space.md },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
