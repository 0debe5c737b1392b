import { Link, useNavigate } from 'react-router-dom';
import { roleLabels } from '@shared/schemas/roles';
import { paths } from '@/config/paths';
import { useLogout, useMe } from '@/lib/auth';
import { formatDateTime } from '@/lib/format';
import { useLinkToken } from '@/hooks/use-link-token';
import { PublicPage } from '@/components/layouts/public-page';
import { Alert, StatusLine } from '@/components/ui/alert';
import { Button, linkClasses } from '@/components/ui/button';
import { LinkMissing, LinkRefused } from '@/components/errors/link-refused';
import { QueryError } from '@/components/errors/query-error';
import { SignInForm } from '@/features/auth/components/sign-in-form';
import { useInvitationLink } from '@/features/invitations/api/get-invitation-link';
import { NewAccountForm } from '@/features/invitations/components/new-account-form';
import { JoinAsMember } from '@/features/invitations/components/join-as-member';

const toSignIn = (
  <Link to={paths.auth.signIn.getHref()} className={linkClasses}>
    Go to sign-in
  </Link>
);

export function InvitationRoute() {
  const token = useLinkToken();
  const invitation = useInvitationLink(token);
  const me = useMe();
  const logout = useLogout();
  const navigate = useNavigate();
  const onAccepted = (projectId: number) => navigate(paths.project.root.getHref(projectId), { replace: true });

  let body;
  if (!token) body = <LinkMissing next={toSignIn} />;
  else if (invitation.isPending || me.isPending) body = <StatusLine>Checking the invitation…</StatusLine>;
  else if (invitation.isError) body = <LinkRefused error={invitation.error} what="The invitation" next={toSignIn} onRetry={() => void invitation.refetch()} />;
  else if (me.isError) body = <QueryError what="Your session" error={me.error} onRetry={() => void me.refetch()} />;
  else {
    const inv = invitation.data;
    const signedInAs = me.data?.user.email ?? null;
    let next;
    if (!inv.accountExists) next = <NewAccountForm token={token} email={inv.email} onAccepted={onAccepted} />;
    else if (signedInAs === inv.email) next = <JoinAsMember token={token} onAccepted={onAccepted} />;
    else if (signedInAs) {
      next = (
        <Alert kind="caution" title={`You are signed in as ${signedInAs}.`}>
          <p>This invitation is for {inv.email}. Sign out, then sign in as {inv.email} to accept it.</p>
          <Button variant="secondary" size="sm" className="mt-2" disabled={logout.isPending} onClick={() => logout.mutate()}>
            Sign out
          </Button>
        </Alert>
      );
    } else {
      next = (
        <>
          <p className="mb-4 text-sm">{inv.email} already has a Starledger account. Sign in to accept; the project joins your list.</p>
          <SignInForm onSignedIn={() => undefined} />
        </>
      );
    }
    body = (
      <>
        <div className="mb-6 rounded-sm border border-rule bg-paper-deep px-4 py-3 text-sm">
          <p>
            {inv.invitedByName ?? 'The lead astronomer'} invites <strong>{inv.email}</strong> to <strong>{inv.projectName}</strong> ({inv.projectCode}) as{' '}
            <strong>{roleLabels[inv.role]}</strong>.
          </p>
          <p className="mt-1 text-ink-soft">The invitation works once, until {formatDateTime(inv.expiresAt)}.</p>
        </div>
        {next}
      </>
    );
  }

  return <PublicPage title="An invitation">{body}</PublicPage>;
}
