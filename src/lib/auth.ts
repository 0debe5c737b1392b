import { queryOptions, useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { LoginBody, MeResponse, User } from '@shared/schemas/auth';
import type { SecondFactorAsked, SignInCodeBody } from '@shared/schemas/second-factor';
import { api, isApiError, setCsrfToken } from './api-client';
import { clearSessionEnded, reportSessionEnded, SESSION_ENDED_FALLBACK } from './session-ended';

/*
 * The session lives here rather than in a feature because the app shell, the
 * route guard and the sign-in page all need it.
 */
export const authKeys = {
  all: ['auth'] as const,
  me: () => [...authKeys.all, 'me'] as const,
};

/** Whether this tab has had a signed-in person since it last signed out: a 401 then means their session ended. */
let hadSession = false;
/** Why the session this browser came with had ended, when the first /auth/me said so. */
let endedBeforeThisPage: string | undefined;

export function whySessionEndedBeforeThisPage(): string | undefined {
  return endedBeforeThisPage;
}

/**
 * The signed-in person, or null when nobody is signed in. When someone was,
 * the 401 is the end of their session: it is reported (session-ended.ts)
 * and thrown, so the query keeps the person it had and the page stays until
 * the app shell decides where to go.
 */
export async function getMe(): Promise<MeResponse | null> {
  try {
    const me = await api.get<MeResponse>('/auth/me');
    setCsrfToken(me.csrfToken);
    hadSession = true;
    return me;
  } catch (error) {
    if (isApiError(error) && error.status === 401) {
      setCsrfToken(null);
      if (hadSession) {
        reportSessionEnded(error.code === 'session_ended' ? error.message : SESSION_ENDED_FALLBACK);
        throw error;
      }
      // A page opened afresh on a session that has since ended: nobody is signed in, and the sign-in page can say why.
      if (error.code === 'session_ended') endedBeforeThisPage = error.message;
      return null;
    }
    throw error;
  }
}

/** A 401 on another request: the session of the person this tab had has ended. */
export function noticeUnauthenticated(error: { code: string; message: string }): void {
  if (!hadSession) return;
  reportSessionEnded(error.code === 'session_ended' ? error.message : SESSION_ENDED_FALLBACK);
}

/** Leaving a page whose session ended for the sign-in page: nobody is signed in any more. */
export function forgetEndedSession(queryClient: QueryClient): void {
  hadSession = false;
  setCsrfToken(null);
  clearSessionEnded();
  queryClient.setQueryData(authKeys.me(), null);
  forgetEverythingButTheSession(queryClient);
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
  hadSession = true;
  endedBeforeThisPage = undefined;
  clearSessionEnded();
  setCsrfToken(me.csrfToken);
  forgetEverythingButTheSession(queryClient);
  queryClient.setQueryData(authKeys.me(), me);
  void queryClient.invalidateQueries({ queryKey: authKeys.me() });
}

/** A correct password signs in, or, for an account with the second factor on, asks for its code (loginCode) first. */
export function login(body: LoginBody): Promise<MeResponse | SecondFactorAsked> {
  return api.post<MeResponse | SecondFactorAsked>('/auth/login', body);
}

export const codeAsked = (answer: MeResponse | SecondFactorAsked): answer is SecondFactorAsked => 'secondFactorRequired' in answer;

export function useLogin() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: login,
    onSuccess: (answer) => {
      if (!codeAsked(answer)) adoptSession(queryClient, answer);
    },
  });
}

/** The sign-in's code step: a current one-time code or an unused recovery code; only then is the session signed in. */
export function loginCode(body: SignInCodeBody): Promise<MeResponse> {
  return api.post<MeResponse>('/auth/login/code', body);
}

export function useLoginCode() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: loginCode,
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
      hadSession = false;
      setCsrfToken(null);
      queryClient.setQueryData(authKeys.me(), null);
      forgetEverythingButTheSession(queryClient);
      void queryClient.invalidateQueries({ queryKey: authKeys.me() });
    },
  });
}
