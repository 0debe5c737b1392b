import { useState } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';
import { useLinkToken } from '@/hooks/use-link-token';
import { PublicPage } from '@/components/layouts/public-page';
import { Alert, StatusLine } from '@/components/ui/alert';
import { ButtonLink, linkClasses } from '@/components/ui/button';
import { LinkMissing, LinkRefused } from '@/components/errors/link-refused';
import { formatDateTime } from '@/lib/format';
import { usePasswordReset } from '@/features/auth/api/get-password-reset';
import { ResetPasswordForm } from '@/features/auth/components/reset-password-form';

const askAgain = (
  <Link to={paths.auth.forgotPassword.getHref()} className={linkClasses}>
    Ask for a new link
  </Link>
);

export function ResetPasswordRoute() {
  const token = useLinkToken();
  const reset = usePasswordReset(token);
  const [done, setDone] = useState<string | null>(null);

  let body;
  if (done) {
    body = (
      <>
        <Alert kind="done" title="Password set.">
          {done}
        </Alert>
        <ButtonLink to={paths.auth.signIn.getHref()} className="mt-6 w-full">
          Sign in
        </ButtonLink>
      </>
    );
  } else if (!token) body = <LinkMissing next={askAgain} />;
  else if (reset.isPending) body = <StatusLine>Checking the link…</StatusLine>;
  else if (reset.isError) body = <LinkRefused error={reset.error} what="The link" next={askAgain} onRetry={() => void reset.refetch()} />;
  else {
    body = (
      <>
        <p className="mb-4 text-sm">
          For <strong>{reset.data.email}</strong>. The link works until {formatDateTime(reset.data.expiresAt)}. Setting the password signs this account out everywhere.
        </p>
        <ResetPasswordForm token={token} email={reset.data.email} onDone={setDone} />
      </>
    );
  }

  return (
    <PublicPage title="Set a new password">
      {body}
    </PublicPage>
  );
}
