import { QueryClient } from '@tanstack/react-query';
import { ApiError, setUnauthorizedListener } from './client';
import { authKeys } from './queryKeys';

const MAX_RETRIES = 2;

/** True when a failed query is worth retrying: network failures and 5xx, never a 4xx answer. */
function shouldRetry(failureCount: number, error: unknown): boolean {
  if (error instanceof ApiError && error.status >= 400 && error.status < 500) return false;
  return failureCount < MAX_RETRIES;
}

/**
 * The one QueryClient of the app: no retries for 4xx answers, and a lapsed session (401 on any
 * call but the session ones) clears the signed-in user so the route guard sends the person to sign-in.
 */
export function createQueryClient(): QueryClient {
  const client = new QueryClient({
    defaultOptions: {
      queries: {
        retry: shouldRetry,
        staleTime: 30_000,
        refetchOnWindowFocus: true,
      },
      mutations: { retry: false },
    },
  });
  setUnauthorizedListener(() => {
    client.setQueryData(authKeys.me(), null);
  });
  return client;
}
