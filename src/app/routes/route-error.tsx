import { useEffect } from 'react';
import { Navigate, isRouteErrorResponse, useLocation, useRouteError } from 'react-router-dom';
import { useQueryErrorResetBoundary } from '@tanstack/react-query';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api-client';
import { ForbiddenMessage, isSecondFactorRequired, NotFoundMessage, SecondFactorRequiredMessage } from '@/components/errors/error-messages';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';

/**
 * Whatever a page threw: the API's 404 and 403 become the not-found and
 * forbidden pages, a lost session goes to sign-in, anything else is shown
 * with the server's message and a way to retry.
 */
export function RouteError() {
  const error = useRouteError();
  const location = useLocation();
  const { reset } = useQueryErrorResetBoundary();

  // Lets queries that failed here try again when the person comes back to the page.
  useEffect(() => reset(), [reset]);

  if ((isApiError(error) && error.status === 404) || (isRouteErrorResponse(error) && error.status === 404)) {
    return <NotFoundMessage />;
  }
  if (isSecondFactorRequired(error)) return <SecondFactorRequiredMessage message={error.message} />;
  if (isApiError(error) && error.status === 403) {
    return <ForbiddenMessage detail={error.message} />;
  }
  if (isApiError(error) && error.status === 401) {
    return <Navigate to={paths.auth.signIn.getHref(location.pathname + location.search)} replace />;
  }

  const message = error instanceof Error ? error.message : 'An unexpected error occurred.';
  return (
    <div className="py-10">
      <title>Error · Starledger</title>
      <h1 className="mb-4 text-3xl font-semibold">This page could not be shown</h1>
      <Alert title="Something went wrong.">
        <p>{message}</p>
        <Button variant="secondary" size="sm" className="mt-2" onClick={() => window.location.reload()}>
          Reload the page
        </Button>
      </Alert>
    </div>
  );
}
