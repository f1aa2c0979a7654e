import { StyleSheet, View } from 'react-native';
import { space } from '@/components/theme';
import { ManagerOnlyState } from '@/components/nav/manager-only';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { EmptyState, ErrorState, LoadingState } from '@/components/ui/state-views';
import { isApiError } from '@/hooks/api-client';
import { useOutboxQuery } from '@/hooks/use-outbox';
import { useSessionQuery } from '@/hooks/use-session';
import { MailCard } from './mail-card';

const TITLE = 'Outbox';
const LEAD = 'E-mail Flakeline sent from this lab — invitations and password resets — newest first.';

export function OutboxScreen() {
  const session = useSessionQuery();
  const isManager = session.data?.role === 'manager';
  const outbox = useOutboxQuery({ enabled: isManager });

  if (!isManager || isApiError(outbox.error, 'forbidden')) {
    return (
      <Screen title={TITLE} testID="outbox-screen">
        <ManagerOnlyState task="read the outbox" />
      </Screen>
    );
  }

  const refresh = (
    <Button
      title="Refresh"
      variant="quiet"
      icon="refresh"
      onPress={() => void outbox.refetch()}
      loading={outbox.isFetching && !outbox.isPending}
      testID="outbox-refresh"
    />
  );

  return (
    <Screen title={TITLE} lead={LEAD} actions={outbox.data?.enabled ? refresh : null} testID="outbox-screen">
      {outbox.data ? (
        outbox.data.enabled ? (
          <View style={styles.messages}>
            <Notice tone="info">
              This lab has no mail server of its own, so Flakeline keeps its e-mail here. Pass a link on to the person it is for;
              anyone who opens it acts as them.
            </Notice>
            {outbox.data.messages.length === 0 ? (
              <EmptyState icon="mail-open-outline" title="Nothing sent yet">
                Invitations and password-reset e-mails appear here as soon as they are sent. Invite someone from People to see
                one.
              </EmptyState>
            ) : (
              outbox.data.messages.map((mail) => <MailCard key={mail.id} mail={mail} />)
            )}
          </View>
        ) : (
          <Notice tone="info" title="E-mail goes to the real mail server" testID="outbox-disabled">
            This Flakeline is connected to a mail server, so invitations and password resets land in people’s own inboxes and are
            not kept here. If someone has not received theirs, check the address on People and resend the invitation.
          </Notice>
        )
      ) : outbox.isError ? (
        <ErrorState
          title="Could not load the outbox"
          error={outbox.error}
          onRetry={() => void outbox.refetch()}
          retrying={outbox.isFetching}
        />
      ) : (
        <LoadingState label="Loading the outbox…" />
      )}
    </Screen>
  );
}

const styles = StyleSheet.create({
  messages: { gap: space.lg },
});
