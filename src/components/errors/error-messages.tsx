import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';
import { linkClasses } from '@/components/ui/button';
import { isApiError, type ApiError } from '@/lib/api-client';

/*
 * What the not-found and forbidden pages say. A project the person is not a
 * member of answers 404 on the server, so "not found" must not hint that it
 * might exist.
 */

/** The page shape both share: status code, heading, what to do, and the way back. */
function StatusMessage({ status, pageTitle, heading, children }: { status: number; pageTitle: string; heading: string; children: ReactNode }) {
  return (
    <div className="py-10">
      <title>{`${pageTitle} · Starledger`}</title>
      <p className="text-xs font-semibold tracking-[0.18em] text-brass-deep uppercase">{status}</p>
      <h1 className="mt-1 text-3xl font-semibold">{heading}</h1>
      <p className="mt-3 max-w-prose text-ink-soft">{children}</p>
      <p className="mt-6">
        <Link to={paths.home.getHref()} className={linkClasses}>
          Back to your projects
        </Link>
      </p>
    </div>
  );
}

export function NotFoundMessage() {
  return (
    <StatusMessage status={404} pageTitle="Not found" heading="Nothing recorded here">
      This page does not exist, or it belongs to a project you are not a member of. Check the address, or ask the project’s lead
      astronomer to add you.
    </StatusMessage>
  );
}

export function ForbiddenMessage({ detail }: { detail?: string }) {
  return (
    <StatusMessage status={403} pageTitle="Not allowed" heading="Your role does not allow this">
      {detail ?? 'You can see this project, but your role in it does not include this page or action.'} If you need it, ask the
      project’s lead astronomer (or a site administrator for account matters).
    </StatusMessage>
  );
}

/**
 * A site admin page refused for want of the second factor (403
 * second_factor_required): the server's words (turn it on, or sign in again
 * with a code) and the way to the Account page that turns it on.
 */
export function SecondFactorRequiredMessage({ message }: { message: string }) {
  return (
    <div className="py-10">
      <title>Second factor needed · Starledger</title>
      <p className="text-xs font-semibold tracking-[0.18em] text-brass-deep uppercase">403</p>
      <h1 className="mt-1 text-3xl font-semibold">A second factor is needed here</h1>
      <p className="mt-3 max-w-prose text-ink-soft">{message}</p>
      <p className="mt-6">
        <Link to={paths.account.secondFactor.getHref()} className={linkClasses}>
          Your account’s second factor
        </Link>
      </p>
    </div>
  );
}

/** Whether an error is the refusal SecondFactorRequiredMessage explains. */
export const isSecondFactorRequired = (error: unknown): error is ApiError => isApiError(error) && error.code === 'second_factor_required';
