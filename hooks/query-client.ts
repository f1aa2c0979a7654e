import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
import { ApiError, forgetCsrfToken, isApiError } from './api-client';
import { sessionKeys } from './query-keys';

/**
 * Two more tries ride out a server restart without leaving someone staring at a spinner
 * (common practice, no source).
 */
const MAX_RETRIES = 2;

/** A 4xx answer will not change by asking again; network trouble and 5xx might. */
function shouldRetry(failureCount: number, error: unknown): boolean {
  if (error instanceof ApiError && error.status >= 400 && error.status < 500) return false;
  return failureCount < MAX_RETRIES;
}

export function createQueryClient(): QueryClient {
  const client: QueryClient = new QueryClient({
    queryCache: new QueryCache({
      onError: (error, query) => noticeSignedOut(error, query.queryKey[0] === sessionKeys.all[0]),
    }),
    mutationCache: new MutationCache({
      onError: (error) => noticeSignedOut(error, false),
    }),
    defaultOptions: {
      queries: { retry: shouldRetry },
      mutations: { retry: false },
    },
  });

  /**
   * When any request finds the session gone (expired, or signed out in another tab), re-ask the
   * session so the lab area's guard sends the person to sign in instead of showing stale screens.
   */
  function noticeSignedOut(error: unknown, isSessionQuery: boolean): void {
    if (!isApiError(error, 'unauthenticated')) return;
    forgetCsrfToken();
    if (!isSessionQuery) void client.invalidateQueries({ queryKey: sessionKeys.all });
  }

  return client;
}
