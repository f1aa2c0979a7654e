import { describeError } from '@/hooks/api-client';
import { useSessionQuery, useSignOutMutation } from '@/hooks/use-session';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { LoadingState } from '@/components/ui/state-views';
import { ChangePasswordCard } from './change-password-card';
import { ProfileCard } from './profile-card';

export function AccountScreen() {
  const session = useSessionQuery();
  const signOut = useSignOutMutation();
  const user = session.data;

  return (
    <Screen title="Account" lead="Your name, your role in the lab and your password." testID="account-screen">
      {user ? (
        <>
          <ProfileCard key={user.id} user={user} />
          <ChangePasswordCard />
          <Card title="Session" lead="On a shared bench computer, sign out when you walk away.">
            {signOut.error ? <Notice tone="error">{describeError(signOut.error)}</Notice> : null}
            <Button
              title="Sign out"
              variant="secondary"
              icon="log-out-outline"
              onPress={() => signOut.mutate()}
              loading={signOut.isPending}
              testID="sign-out"
            />
          </Card>
        </>
      ) : (
        <LoadingState label="Loading your account…" />
      )}
    </Screen>
  );
}
