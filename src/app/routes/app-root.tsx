import { useEffect, useState } from 'react';
import { Navigate, Outlet, useLocation, useNavigate, useParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { roleCan } from '@shared/schemas/roles';
import { paths } from '@/config/paths';
import { useLogout, useMe, whySessionEndedBeforeThisPage } from '@/lib/auth';
import { forgetTyping, hasUnsavedTyping, useSessionEnded, watchTyping } from '@/lib/session-ended';
import { Alert } from '@/components/ui/alert';
import { PasswordChangeRequired } from '@/features/auth/components/password-change-required';
import { Button } from '@/components/ui/button';
import { AppShell } from '@/components/layouts/app-shell';
import { QueryError } from '@/components/errors/query-error';
import { RouteLoading } from './route-loading';
import { projectQueryOptions } from '@/features/projects/api/get-project';

/** Shows the project's code and name in the shell; a failure here is the page's to report, not the shell's. */
function useShellProject(projectIdParam: string | undefined) {
  const projectId = projectIdParam && /^[1-9]\d*$/.test(projectIdParam) ? Number(projectIdParam) : null;
  const query = useQuery({
    ...projectQueryOptions(projectId ?? 0),
    enabled: projectId !== null,
    throwOnError: false,
  });
  if (projectId !== null && query.isPending) return 'pending' as const;
  return projectId !== null && query.data
    ? {
        id: query.data.id,
        code: query.data.code,
        name: query.data.name,
        canUpload: roleCan(query.data.myRole, 'upload'),
        canReadQueue: roleCan(query.data.myRole, 'readQueue'),
        canReadTrail: roleCan(query.data.myRole, 'readTrail'),
        canManageSettings: roleCan(query.data.myRole, 'manageSettings'),
        canManageSummary: roleCan(query.data.myRole, 'manageSummary'),
      }
    : null;
}

/**
 * The signed-in part of Starledger. Without a session it sends the person to
 * sign-in, remembering where they were going.
 */
export function AppRoot() {
  const me = useMe();
  const location = useLocation();
  const navigate = useNavigate();
  const logout = useLogout();
  const project = useShellProject(useParams().projectId);
  // A deliberate sign-out goes to a clean sign-in page, not back to where the person was.
  const [signingOut, setSigningOut] = useState(false);
  const ended = useSessionEnded();
  const here = location.pathname + location.search;
  // The sign-in page forgets the ended session when it arrives (sign-in.tsx), so that this shell does not first redirect without the reason.
  const signInAgain = () => navigate(paths.auth.signIn.getHref(here), { replace: true, state: { sessionEnded: ended } });

  useEffect(watchTyping, []);
  useEffect(forgetTyping, [location.pathname]);
  // The reason travels to the sign-in page in the history entry's state, not in the address.
  // Nothing typed would be lost: straight to sign-in, saying why, and back here afterwards.
  const leaveAtOnce = ended !== null && !hasUnsavedTyping();
  useEffect(() => {
    if (leaveAtOnce) signInAgain();
  });

  if (leaveAtOnce) return <RouteLoading />;
  if (me.isPending) return <RouteLoading />;
  if (me.isError && !(ended && me.data)) {
    return (
      <div className="mx-auto max-w-xl px-6 py-16">
        <QueryError what="Your session" error={me.error} onRetry={() => void me.refetch()} />
      </div>
    );
  }
  if (!me.data) {
    const reason = signingOut ? undefined : whySessionEndedBeforeThisPage();
    return <Navigate to={paths.auth.signIn.getHref(signingOut ? null : here)} replace state={reason ? { sessionEnded: reason } : undefined} />;
  }

  const signOut = () => {
    setSigningOut(true);
    logout.mutate(undefined, {
      onSuccess: () => navigate(paths.auth.signIn.getHref(), { replace: true }),
      onError: () => {
        setSigningOut(false);
      },
    });
  };
  // An account that must choose a new password first sees only that (the server refuses it everything else).
  if (me.data.user.mustChangePassword) {
    return <PasswordChangeRequired email={me.data.user.email} reason={me.data.user.mustChangePassword} signingOut={logout.isPending} onSignOut={signOut} />;
  }

  return (
    <AppShell
      userName={me.data.user.name}
      isSiteAdmin={me.data.user.isSiteAdmin}
      project={project === 'pending' ? null : project}
      projectPending={project === 'pending'}
      signingOut={logout.isPending}
      signOutError={logout.isError ? logout.error.message : null}
      onSignOut={signOut}
    >
      {ended ? (
        <Alert kind="caution" title={ended} className="mb-6">
          <p>
            What you typed on this page is still here but has not been saved. Copy it before you go, or sign in again in another tab and then save
            it here.
          </p>
          <div className="mt-3 flex flex-wrap gap-2">
            <Button onClick={signInAgain}>Sign in again</Button>
            <a className="rounded-sm px-2 py-1.5 text-sm text-brass underline-offset-4 hover:underline" href={paths.auth.signIn.getHref()} target="_blank" rel="noopener">
              Sign in in a new tab
            </a>
          </div>
        </Alert>
      ) : null}
      <Outlet />
    </AppShell>
  );
}
