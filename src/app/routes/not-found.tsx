import { NotFoundMessage } from '@/components/errors/error-messages';

export function NotFoundRoute() {
  return <NotFoundMessage />;
}
