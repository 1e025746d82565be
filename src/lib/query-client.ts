import { QueryCache, QueryClient } from '@tanstack/react-query';
import { isApiError } from './api';
import { meQueryOptions } from './session';

/** One query client for the app. 4xx answers are final (retrying a 403 or 404 cannot help). */
export function createQueryClient(): QueryClient {
  const client: QueryClient = new QueryClient({
    // A 401 from any request means the session ended (expired or signed out elsewhere): forget the
    // person, and the session guard sends them to the sign-in page.
    queryCache: new QueryCache({
      onError: (error) => {
        if (isApiError(error, 401)) client.setQueryData(meQueryOptions().queryKey, null);
      },
    }),
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        refetchOnWindowFocus: false,
        retry: (count, error) => !(isApiError(error) && error.status >= 400 && error.status < 500) && count < 2,
      },
      mutations: { retry: false },
    },
  });
  return client;
}
