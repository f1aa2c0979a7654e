import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { ROLE_LABELS, type Role } from '@/shared/roles';
import type { User } from '@/shared/schemas/user';
import { space } from '@/components/theme';
import { RoleBadge, StatusPill } from '@/components/ui/badges';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { DetailRow } from '@/components/ui/detail-row';
import { FormProblem } from '@/components/ui/form-problem';
import { formatDate, formatDateTime } from '@/components/ui/format';
import { Notice } from '@/components/ui/notice';
import { Heading, Text } from '@/components/ui/text';
import { useResendInvitationMutation, useUpdateUserMutation } from '@/hooks/use-users';
import { ROLE_CHOICES } from './invite-person-card';

export interface PersonDetailProps {
  person: User;
  isYou: boolean;
}

/** One person: who they are, and what a lab manager can change about their access. */
export function PersonDetail({ person, isYou }: PersonDetailProps) {
  return (
    <View style={styles.stack} testID="person-detail">
      <Card>
        <View style={styles.identity}>
          <Heading level={2}>{isYou ? `${person.displayName} (you)` : person.displayName}</Heading>
          <Text tone="muted" selectable>
            {person.email}
          </Text>
          <View style={styles.badges}>
            <RoleBadge role={person.role} />
            <StatusPill status={person.status} />
          </View>
        </View>
        <View style={styles.facts}>
          <DetailRow label={person.status === 'invited' ? 'Invited on' : 'Account created'}>
            {formatDate(person.createdAt)}
          </DetailRow>
          <DetailRow label="Last signed in">{person.lastSignInAt ? formatDateTime(person.lastSignInAt) : 'Never'}</DetailRow>
        </View>
      </Card>
      <RoleCard person={person} isYou={isYou} />
      <AccessCard person={person} isYou={isYou} />
    </View>
  );
}

function RoleCard({ person, isYou }: PersonDetailProps) {
  const update = useUpdateUserMutation();
  const [role, setRole] = useState<Role>(person.role);
  const [saved, setSaved] = useState(false);

  const save = () => {
    setSaved(false);
    update.mutate({ id: person.id, changes: { role } }, { onSuccess: () => setSaved(true) });
  };

  return (
    <Card
      title="Role"
      lead={isYou ? 'Changing your own role takes effect straight away.' : 'What they may do in Flakeline.'}
      testID="person-role-card"
    >
      <ChoiceGroup
        label="Role"
        choices={ROLE_CHOICES}
        value={role}
        onChange={(next) => {
          setSaved(false);
          update.reset();
          setRole(next);
        }}
        testID="person-role"
      />
      {saved ? <Notice tone="success">{`Role changed to ${ROLE_LABELS[role]}.`}</Notice> : null}
      <FormProblem title="Could not change the role" error={update.error} />
      <Button
        title="Save role"
        variant="secondary"
        onPress={save}
        loading={update.isPending}
        disabled={role === person.role}
        testID="person-save-role"
      />
    </Card>
  );
}

function AccessCard({ person, isYou }: PersonDetailProps) {
  const update = useUpdateUserMutation();
  const resend = useResendInvitationMutation();
  const [confirming, setConfirming] = useState(false);
  const error = update.error ?? resend.error;

  const setStatus = (status: 'active' | 'deactivated') => {
    resend.reset();
    update.mutate({ id: person.id, changes: { status } }, { onSettled: () => setConfirming(false) });
  };

  const resendInvitation = () => {
    update.reset();
    resend.mutate(person.id);
  };

  const leaving = person.status === 'invited' ? 'Withdraw invitation' : 'Deactivate';

  return (
    <Card title="Access" lead={ACCESS_LEADS[person.status]} testID="person-access-card">
      {resend.isSuccess ? <Notice tone="success">{resend.data.message}</Notice> : null}
      <FormProblem title="Could not change access" error={error} />
      {confirming ? (
        <Notice
          tone="warn"
          title={isYou ? 'Deactivate your own account?' : `${leaving} for ${person.displayName}?`}
          action={
            <>
              <Button
                title={person.status === 'invited' ? 'Yes, withdraw' : 'Yes, deactivate'}
                variant="danger"
                onPress={() => setStatus('deactivated')}
                loading={update.isPending}
                testID="person-confirm-deactivate"
              />
              <Button title="Keep access" variant="quiet" onPress={() => setConfirming(false)} />
            </>
          }
        >
          {person.status === 'invited'
            ? 'Their invitation link stops working. Their name stays on any history.'
            : isYou
              ? 'You will no longer be able to sign in. Everything you recorded stays, with your name on it.'
              : 'They can no longer sign in. Everything they recorded stays, with their name on it.'}
        </Notice>
      ) : (
        <View style={styles.actions}>
          {person.status === 'invited' ? (
            <Button
              title="Resend invitation"
              variant="secondary"
              icon="mail-outline"
              onPress={resendInvitation}
              loading={resend.isPending}
              testID="person-resend-invitation"
            />
          ) : null}
          {person.status === 'deactivated' ? (
            <Button
              title="Reactivate"
              variant="secondary"
              icon="refresh"
              onPress={() => setStatus('active')}
              loading={update.isPending}
              testID="person-reactivate"
            />
          ) : (
            <Button
              title={leaving}
              variant="danger"
              onPress={() => {
                update.reset();
                setConfirming(true);
              }}
              testID="person-deactivate"
            />
          )}
        </View>
      )}
    </Card>
  );
}

const ACCESS_LEADS: Record<User['status'], string> = {
  invited: 'Has not chosen a password yet. A new invitation makes earlier links stop working.',
  active: 'Can sign in and work according to their role.',
  deactivated: 'Cannot sign in. Their records and history are kept.',
};

const styles = StyleSheet.create({
  stack: { gap: space.lg },
  identity: { gap: space.xs },
  badges: { flexDirection: 'row', flexWrap: 'wrap', gap: space.xs, paddingTop: space.xs },
  facts: { flexDirection: 'row', flexWrap: 'wrap', gap: space.xl },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
