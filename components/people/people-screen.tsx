import { StyleSheet, View } from 'react-native';
import type { User } from '@/shared/schemas/user';
import { sizes, space } from '@/components/theme';
import { ManagerOnlyState } from '@/components/nav/manager-only';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { EmptyState, ErrorState, LoadingState } from '@/components/ui/state-views';
import { Text } from '@/components/ui/text';
import { TextLink } from '@/components/ui/text-link';
import { isApiError } from '@/hooks/api-client';
import { useBreakpoints } from '@/hooks/use-breakpoints';
import { useSessionQuery } from '@/hooks/use-session';
import { useUsersQuery } from '@/hooks/use-users';
import { InvitePersonCard } from './invite-person-card';
import { PersonDetail } from './person-detail';
import { PersonRow } from './person-row';

const TITLE = 'People';
const LEAD = 'Who can sign in to this lab’s Flakeline, and what each person may do.';

export function PeopleScreen({ selectedId }: { selectedId: number | null }) {
  const session = useSessionQuery();
  const isManager = session.data?.role === 'manager';
  const users = useUsersQuery({ enabled: isManager });
  const { isWide } = useBreakpoints();

  // Reached by link without the role, or the role was taken away since this page loaded.
  if (!isManager || isApiError(users.error, 'forbidden')) {
    return (
      <Screen title={TITLE} testID="people-screen">
        <ManagerOnlyState task="manage people" />
      </Screen>
    );
  }

  const refresh = (
    <Button
      title="Refresh"
      variant="quiet"
      icon="refresh"
      onPress={() => void users.refetch()}
      loading={users.isFetching && !users.isPending}
      testID="people-refresh"
    />
  );

  if (!users.data) {
    return (
      <Screen title={TITLE} lead={LEAD} testID="people-screen">
        {users.isError ? (
          <ErrorState
            title="Could not load the people in this lab"
            error={users.error}
            onRetry={() => void users.refetch()}
            retrying={users.isFetching}
          />
        ) : (
          <LoadingState label="Loading the people in this lab…" />
        )}
      </Screen>
    );
  }

  const people = users.data;
  const selected = selectedId === null ? null : (people.find((person) => person.id === selectedId) ?? null);
  const youId = session.data?.id;
  const detail =
    selectedId === null ? null : selected ? (
      <PersonDetail key={selected.id} person={selected} isYou={selected.id === youId} />
    ) : (
      <Notice tone="warn" title="That person is not in the list" testID="person-missing">
        The link may be old, or the account was removed. Choose someone from the list.
      </Notice>
    );

  // Phones and tablets: the chosen person replaces the list, with a way back.
  if (!isWide && selectedId !== null) {
    return (
      <Screen title={TITLE} testID="people-screen">
        <TextLink href="/people" testID="people-back">
          ← All people
        </TextLink>
        {detail}
      </Screen>
    );
  }

  const list = <PeopleList people={people} selectedId={selectedId} youId={youId} />;

  return (
    <Screen title={TITLE} lead={LEAD} actions={refresh} width="wide" testID="people-screen">
      {isWide ? (
        <View style={styles.split}>
          <View style={styles.listPane}>{list}</View>
          <View style={styles.detailPane}>
            {detail ?? (
              <EmptyState icon="person-outline" title="No one selected" testID="person-none-selected">
                Choose a person to see their details, change their role or manage their access.
              </EmptyState>
            )}
          </View>
        </View>
      ) : (
        list
      )}
    </Screen>
  );
}

interface PeopleListProps {
  people: User[];
  selectedId: number | null;
  youId: number | undefined;
}

function PeopleList({ people, selectedId, youId }: PeopleListProps) {
  const counts = countByStatus(people);
  return (
    <View style={styles.list}>
      <InvitePersonCard />
      <Text variant="caption" tone="muted" testID="people-counts">
        {`${counts.active} active · ${counts.invited} invited · ${counts.deactivated} deactivated`}
      </Text>
      {people.length === 0 ? (
        <EmptyState icon="people-outline" title="No one here yet">
          Invite the people in your lab with the button above.
        </EmptyState>
      ) : (
        <View style={styles.rows} role="list" accessibilityLabel="People in this lab">
          {people.map((person) => (
            <View key={person.id} role="listitem">
              <PersonRow person={person} selected={person.id === selectedId} isYou={person.id === youId} />
            </View>
          ))}
        </View>
      )}
    </View>
  );
}

function countByStatus(people: User[]): Record<User['status'], number> {
  const counts = { invited: 0, active: 0, deactivated: 0 };
  for (const person of people) counts[person.status] += 1;
  return counts;
}

const styles = StyleSheet.create({
  split: { flexDirection: 'row', gap: space.xl, alignItems: 'flex-start' },
  listPane: { width: sizes.listPaneWidth, flexShrink: 0 },
  detailPane: { flex: 1, minWidth: 0 },
  list: { gap: space.md },
  rows: { gap: space.sm },
});
