import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
import { authKeys, noticeUnauthenticated } from './auth';
import { isApiError } from './api-client';
import { clearSessionEnded, forgetTyping } from './session-ended';

/*
 * A 401 on any request other than /auth/me (which reports its own) means the
 * session ended (expired, ended from another browser, signed out in another
 * tab). It is reported, and the app shell sends the person to sign-in and
 * back to where they were, or first says so when something typed would be lost.
 */
function onUnauthenticated(error: unknown, queryKey?: readonly unknown[]) {
  if (!isApiError(error) || error.status !== 401) return;
  if (queryKey && queryKey[0] === authKeys.all[0]) return;
  noticeUnauthenticated(error);
}

/* A request that succeeds after a session ended means the person signed in again (in another tab): the page goes on. */
function onSucceeded() {
  if (clearSessionEnded()) void queryClient.invalidateQueries({ queryKey: authKeys.me() });
}

export const queryClient = new QueryClient({
  queryCache: new QueryCache({ onError: (error, query) => onUnauthenticated(error, query.queryKey), onSuccess: onSucceeded }),
  mutationCache: new MutationCache({
    onError: (error) => onUnauthenticated(error),
    onSuccess: () => {
      // What was typed has been sent and kept.
      forgetTyping();
      onSucceeded();
    },
  }),
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
