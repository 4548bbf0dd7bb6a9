import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
import { ApiError } from './api-client';

/**
 * A 401 anywhere means the session has ended: asking again who is signed in lets the sign-in gate
 * replace the page with the sign-in page (saying the session ended). A CSRF refusal also re-reads
 * who is signed in, which re-arms the token.
 */
export function createQueryClient(): QueryClient {
  const client: QueryClient = new QueryClient({
    queryCache: new QueryCache({ onError: (error, query) => onApiError(error, query.queryKey[0] === 'me') }),
    mutationCache: new MutationCache({ onError: (error) => onApiError(error, false) }),
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        // Retrying a 4xx only repeats the same answer.
        retry: (count, error) => !(error instanceof ApiError && error.status >= 400 && error.status < 500) && count < 2,
        refetchOnWindowFocus: false,
      },
    },
  });
  function onApiError(error: unknown, isMeQuery: boolean): void {
    if (isMeQuery || !(error instanceof ApiError)) return;
    if (error.status === 401 || error.code === 'csrf_invalid') void client.invalidateQueries({ queryKey: ['me'] });
  }
  return client;
}
