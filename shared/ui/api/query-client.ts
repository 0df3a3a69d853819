import { QueryCache, QueryClient } from '@tanstack/react-query';
import { ApiRequestError, isApiStatus } from './client';
import { sessionKeys } from './use-session';

/**
 * The app's query client. Client errors (4xx) are not retried; a 401 from any other query means
 * the session ended, so the session is marked signed out and the gate sends the user to sign in.
 */
export function createQueryClient(): QueryClient {
  const client: QueryClient = new QueryClient({
    queryCache: new QueryCache({
      onError: (err, query) => {
        if (isApiStatus(err, 401) && query.queryKey[0] !== sessionKeys.all[0]) {
          client.setQueryData(sessionKeys.me(), null);
        }
      },
    }),
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        retry: (failureCount, err) =>
          !(err instanceof ApiRequestError && err.status >= 400 && err.status < 500) && failureCount < 2,
      },
      mutations: { retry: false },
    },
  });
  return client;
}
