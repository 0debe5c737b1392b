import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
import { authKeys } from './auth';
import { isApiError } from './api-client';

/*
 * A 401 on any request other than /auth/me means the session ended (expired,
 * or signed out in another tab). Marking the session as gone lets the app
 * shell send the person to sign-in and back to where they were.
 */
function onUnauthenticated(error: unknown, queryKey?: readonly unknown[]) {
  if (!isApiError(error) || error.status !== 401) return;
  if (queryKey && queryKey[0] === authKeys.all[0]) return;
  queryClient.setQueryData(authKeys.me(), null);
}

export const queryClient = new QueryClient({
  queryCache: new QueryCache({ onError: (error, query) => onUnauthenticated(error, query.queryKey) }),
  mutationCache: new MutationCache({ onError: (error) => onUnauthenticated(error) }),
  defaultOptions: {
    queries: {
      staleTime: 30 * 1000,
      // Client errors will not fix themselves on retry; network and server errors might.
      retry: (failureCount, error) => {
        if (isApiError(error) && error.status >= 400 && error.status < 500) return false;
        return failureCount < 2;
      },
      // 403 and 404 replace the page with the forbidden or not-found page (see app/routes/route-error.tsx).
      throwOnError: (error) => isApiError(error) && (error.status === 403 || error.status === 404),
    },
  },
});
