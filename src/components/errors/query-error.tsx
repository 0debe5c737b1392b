import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';

/** A failed load that is worth retrying (network, server error), with the server's message. */
export function QueryError({ what, error, onRetry }: { what: string; error: Error; onRetry?: () => void }) {
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
