import { Redirect, Slot } from 'expo-router';
import { LabShell } from '@/components/nav/lab-shell';
import { ErrorState, LoadingState } from '@/components/ui/state-views';
import { useCurrentPath } from '@/hooks/use-next-path';
import { isSignedOutError, useSessionQuery } from '@/hooks/use-session';

/**
 * Everything in (lab) needs a signed-in person; anyone else is sent to sign in and brought back.
 * The Slot stays mounted under every cover, or expo-router forgets the address being guarded.
 */
export default function LabLayout() {
  const session = useSessionQuery();
  const currentPath = useCurrentPath();

  const cover = isSignedOutError(session.error) ? (
    <Redirect href={`/sign-in?next=${encodeURIComponent(currentPath)}`} />
  ) : session.data ? null : session.isError ? (
    <ErrorState
      fill
      title="Could not check who is signed in"
      error={session.error}
      onRetry={() => void session.refetch()}
      retrying={session.isFetching}
    />
  ) : (
    <LoadingState fill label="Checking who is signed in…" />
  );

  return (
    <LabShell user={session.data} cover={cover}>
      <Slot />
    </LabShell>
  );
}
