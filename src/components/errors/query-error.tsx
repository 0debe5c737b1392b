import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { isSecondFactorRequired, SecondFactorRequiredMessage } from './error-messages';

/**
 * A failed load that is worth retrying (network, server error), with the server's message.
 * `inline` puts a quiet "Try again" right after the message, for a list that sits among other
 * things on its page rather than being the whole page. A site admin page
 * refused for want of a second factor says so, with the way to turn it on.
 */
export function QueryError({ what, error, onRetry, inline = false }: { what: string; error: Error; onRetry?: () => void; inline?: boolean }) {
  if (isSecondFactorRequired(error)) return <SecondFactorRequiredMessage message={error.message} />;
  if (inline) {
    return (
      <Alert title={`${what} could not be loaded.`}>
        {error.message}
        {onRetry ? (
          <>
            {' '}
            <Button variant="quiet" size="sm" onClick={onRetry}>
              Try again
            </Button>
          </>
        ) : null}
      </Alert>
    );
  }
  return (
    <Alert title={`${what} could not be loaded.`}>
      <p>{error.message}</p>
      {onRetry ? (
        <Button variant="secondary" size="sm" className="mt-2" onClick={onRetry}>
          Try again
        </Button>
      ) : null}
    </Alert>
  );
}
