import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';
import { linkClasses } from '@/components/ui/button';

/*
 * What the not-found and forbidden pages say. A project the person is not a
 * member of answers 404 on the server, so "not found" must not hint that it
 * might exist.
 */

export function NotFoundMessage() {
  return (
    <div className="py-10">
      <title>Not found · Starledger</title>
      <p className="text-xs font-semibold tracking-[0.18em] text-brass-deep uppercase">404</p>
      <h1 className="mt-1 text-3xl font-semibold">Nothing recorded here</h1>
      <p className="mt-3 max-w-prose text-ink-soft">
        This page does not exist, or it belongs to a project you are not a member of. Check the address, or ask the project’s lead
        astronomer to add you.
      </p>
      <p className="mt-6">
        <Link to={paths.home.getHref()} className={linkClasses}>
          Back to your projects
        </Link>
      </p>
    </div>
  );
}

export function ForbiddenMessage({ detail }: { detail?: string }) {
  return (
    <div className="py-10">
      <title>Not allowed · Starledger</title>
      <p className="text-xs font-semibold tracking-[0.18em] text-brass-deep uppercase">403</p>
      <h1 className="mt-1 text-3xl font-semibold">Your role does not allow this</h1>
      <p className="mt-3 max-w-prose text-ink-soft">
        {detail ?? 'You can see this project, but your role in it does not include this page or action.'} If you need it, ask the
        project’s lead astronomer (or a site administrator for account matters).
      </p>
      <p className="mt-6">
        <Link to={paths.home.getHref()} className={linkClasses}>
          Back to your projects
        </Link>
      </p>
    </div>
  );
}
