import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useRouter } from 'expo-router';
import type { z } from 'zod';
import { CurrentSession, SignInResult, type SignInInput } from '@/shared/schemas/auth';
import type { User } from '@/shared/schemas/user';
import { apiFetch, forgetCsrfToken, isApiError, rememberCsrfToken } from './api-client';
import { sessionKeys, STALE_TIMES } from './query-keys';

/** The signed-in person. Fails with an `ApiError` of status 401 when nobody is signed in. */
export function useSessionQuery() {
  return useQuery({
    queryKey: sessionKeys.current(),
    queryFn: async ({ signal }) => (await apiFetch('/api/auth/session', { schema: CurrentSession, signal })).user,
    staleTime: STALE_TIMES.session,
  });
}

/** True when the session query failed because nobody is signed in (rather than, say, a network fault). */
export function isSignedOutError(error: unknown): boolean {
  return isApiError(error) && error.status === 401;
}

/**
 * A new session begins: drop everything cached for whoever used this device before, then
 * record who is signed in now. Removing (not clearing) keeps mounted session observers attached.
 */
export function startSession(queryClient: QueryClient, result: SignInResult): void {
  rememberCsrfToken(result.csrfToken);
  queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== sessionKeys.all[0] });
  queryClient.setQueryData<User>(sessionKeys.current(), result.user);
}

export function useSignInMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: z.output<typeof SignInInput>) =>
      apiFetch('/api/auth/sign-in', { method: 'POST', body: input, schema: SignInResult }),
    onSuccess: (result) => startSession(queryClient, result),
  });
}

export function useSignOutMutation() {
  const queryClient = useQueryClient();
  const router = useRouter();
  return useMutation({
    mutationFn: async () => {
      try {
        await apiFetch('/api/auth/sign-out', { method: 'POST' });
      } catch (error) {
        // Already signed out (expired session) is the outcome the person asked for.
        if (!isApiError(error, 'unauthenticated')) throw error;
      }
    },
    onSuccess: () => {
      forgetCsrfToken();
      // Leave the lab area first so its screens do not refetch while the cache empties.
      router.replace('/sign-in');
      queryClient.clear();
    },
  });
}
