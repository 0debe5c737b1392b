import { Link, Navigate, useLocation, useNavigate, useSearchParams } from 'react-router-dom';
import { paths, safeRedirect } from '@/config/paths';
import { useEffect } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { forgetEndedSession, useMe } from '@/lib/auth';
import { PublicPage } from '@/components/layouts/public-page';
import { Alert, StatusLine } from '@/components/ui/alert';
import { linkClasses } from '@/components/ui/button';
import { QueryError } from '@/components/errors/query-error';
import { SignInForm } from '@/features/auth/components/sign-in-form';

export function SignInRoute() {
  const [searchParams] = useSearchParams();
  const navigate = useNavigate();
  const redirectTo = safeRedirect(searchParams.get('redirectTo'));
  const me = useMe();
  // Why the last session ended, when the app shell sent the person here for that (app-root.tsx).
  const sessionEnded = (useLocation().state as { sessionEnded?: unknown } | null)?.sessionEnded;
  const endedHere = typeof sessionEnded === 'string';
  const queryClient = useQueryClient();
  useEffect(() => {
    if (endedHere) forgetEndedSession(queryClient);
  }, [endedHere, queryClient]);

  if (me.data && !endedHere) return <Navigate to={redirectTo} replace />;

  return (
    <PublicPage title="Sign in" subtitle="The observing programme’s shared ledger of stars.">
      {endedHere ? <Alert kind="notice" title={sessionEnded} className="mb-4" /> : null}
      {me.isPending ? <StatusLine>Checking your session…</StatusLine> : null}
      {me.isError ? <QueryError what="Your session" error={me.error} onRetry={() => void me.refetch()} /> : null}
      {me.isSuccess ? <SignInForm onSignedIn={() => navigate(redirectTo, { replace: true })} /> : null}
      <p className="mt-6 text-center text-sm">
        <Link to={paths.auth.forgotPassword.getHref()} className={linkClasses}>
          Forgot your password?
        </Link>
      </p>
      <p className="mt-3 text-center text-sm">
        <Link to={paths.privacy.getHref()} className={linkClasses}>
          Privacy notice
        </Link>
      </p>
      {redirectTo !== paths.home.getHref() ? (
        <p className="mt-6 text-center text-xs text-ink-soft">After signing in you will return to the page you asked for.</p>
      ) : null}
    </PublicPage>
  );
}
