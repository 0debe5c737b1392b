import { Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import { paths, safeRedirect } from '@/config/paths';
import { useMe } from '@/lib/auth';
import { Wordmark } from '@/components/layouts/wordmark';
import { DimToggle, ThemeToggle } from '@/components/layouts/theme-toggle';
import { StatusLine } from '@/components/ui/alert';
import { QueryError } from '@/components/errors/query-error';
import { SignInForm } from '@/features/auth/components/sign-in-form';

export function SignInRoute() {
  const [searchParams] = useSearchParams();
  const navigate = useNavigate();
  const redirectTo = safeRedirect(searchParams.get('redirectTo'));
  const me = useMe();

  if (me.data) return <Navigate to={redirectTo} replace />;

  return (
    <div className="flex min-h-screen flex-col bg-paper text-ink">
      <title>Sign in · Starledger</title>
      <div className="flex justify-end gap-3 px-6 py-4">
        <ThemeToggle />
        <DimToggle />
      </div>
      <main className="mx-auto w-full max-w-sm flex-1 px-6 pt-10 pb-16">
        <div className="mb-8 border-b-4 border-double border-rule pb-4 text-center">
          <Wordmark className="justify-center" />
          <h1 className="mt-4 text-2xl font-semibold">Sign in</h1>
          <p className="mt-1 text-sm text-ink-soft">The observing programme’s shared ledger of stars.</p>
        </div>
        {me.isPending ? <StatusLine>Checking your session…</StatusLine> : null}
        {me.isError ? <QueryError what="Your session" error={me.error} onRetry={() => void me.refetch()} /> : null}
        {me.isSuccess ? <SignInForm onSignedIn={() => navigate(redirectTo, { replace: true })} /> : null}
        {redirectTo !== paths.home.getHref() ? (
          <p className="mt-6 text-center text-xs text-ink-soft">After signing in you will return to the page you asked for.</p>
        ) : null}
      </main>
    </div>
  );
}
