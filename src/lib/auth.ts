import { queryOptions, useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { LoginBody, MeResponse, User } from '@shared/schemas/auth';
import { api, isApiError, setCsrfToken } from './api-client';

/*
 * The session lives here rather than in a feature because the app shell, the
 * route guard and the sign-in page all need it.
 */
export const authKeys = {
  all: ['auth'] as const,
  me: () => [...authKeys.all, 'me'] as const,
};

/** The signed-in person, or null when nobody is signed in. */
export async function getMe(): Promise<MeResponse | null> {
  try {
    const me = await api.get<MeResponse>('/auth/me');
    setCsrfToken(me.csrfToken);
    return me;
  } catch (error) {
    if (isApiError(error) && error.status === 401) {
      setCsrfToken(null);
      return null;
    }
    throw error;
  }
}

export const meQueryOptions = () =>
  queryOptions({
    queryKey: authKeys.me(),
    queryFn: getMe,
    staleTime: 5 * 60 * 1000,
  });

export function useMe() {
  return useQuery(meQueryOptions());
}

/** For screens inside the signed-in shell, which only renders once the user is known. */
export function useUser(): User {
  const { data } = useMe();
  if (!data) throw new Error('useUser is only valid inside the signed-in app shell.');
  return data.user;
}

/** Another person's cached pages must never show after the session changes hands. */
function forgetEverythingButTheSession(queryClient: QueryClient) {
  queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== authKeys.all[0] });
}

/** A session that began in this browser (sign-in, or an accepted invitation that created the account) replaces whatever was cached. */
export function adoptSession(queryClient: QueryClient, me: MeResponse) {
  setCsrfToken(me.csrfToken);
  forgetEverythingButTheSession(queryClient);
  queryClient.setQueryData(authKeys.me(), me);
  void queryClient.invalidateQueries({ queryKey: authKeys.me() });
}

export function login(body: LoginBody): Promise<MeResponse> {
  return api.post<MeResponse>('/auth/login', body);
}

export function useLogin() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: login,
    onSuccess: (me) => adoptSession(queryClient, me),
  });
}

export function logout(): Promise<void> {
  return api.post<void>('/auth/logout');
}

export function useLogout() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: logout,
    onSuccess: () => {
      setCsrfToken(null);
      queryClient.setQueryData(authKeys.me(), null);
      forgetEverythingButTheSession(queryClient);
      void queryClient.invalidateQueries({ queryKey: authKeys.me() });
    },
  });
}
