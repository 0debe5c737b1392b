import type { ReactNode } from 'react';
import { Link, NavLink, useMatch, useNavigation } from 'react-router-dom';
import { paths } from '@/config/paths';
import { cn } from '@/lib/cn';
import { linkClasses } from '@/components/ui/button';
import { Wordmark } from './wordmark';
import { DimToggle, ThemeToggle } from './theme-toggle';

export interface ShellProject {
  id: number;
  code: string;
  name: string;
  /** Observers and the lead astronomer see the Upload link; the server refuses everyone else anyway. */
  canUpload: boolean;
  /** Observers and the lead astronomer see the Review link (permission readQueue). */
  canReadQueue: boolean;
  /** Observers, the lead astronomer and the PI see the Trail link (permission readTrail). */
  canReadTrail: boolean;
  /** The lead astronomer sees the Settings link (permission manageSettings). */
  canManageSettings: boolean;
  /** The PI and the lead astronomer see the Weekly summary link (permission manageSummary). */
  canManageSummary: boolean;
}

const navLinkClasses = ({ isActive }: { isActive: boolean }) =>
  cn(
    'border-b-2 px-1 py-1 text-sm',
    isActive ? 'border-brass font-semibold text-ink' : 'border-transparent text-ink-soft hover:border-rule hover:text-ink',
  );

/** The project bar's box, the same whether it holds the project or keeps its room while the project loads. */
const PROJECT_BAR = 'mx-auto min-h-12 max-w-6xl px-6 py-2';

/**
 * The frame around every signed-in page: the wordmark, the main places, the
 * current project's own pages when one is open, the night theme switch and
 * the person's name with Sign out.
 */
export function AppShell({
  userName,
  isSiteAdmin,
  project,
  projectPending = false,
  onSignOut,
  signingOut,
  signOutError,
  children,
}: {
  userName: string;
  isSiteAdmin: boolean;
  project?: ShellProject | null;
  /** A project page whose project is still loading: its bar's room is kept, so the page does not move down when it arrives. */
  projectPending?: boolean;
  onSignOut: () => void;
  signingOut: boolean;
  signOutError?: string | null;
  children: ReactNode;
}) {
  const navigation = useNavigation();
  const busy = navigation.state !== 'idle';
  // Targets stays marked while a target's own pages are open; Members, Upload and Uploads are places of their own.
  const onMembersPage = useMatch(paths.project.members.path) !== null;
  const onUploadPage = useMatch(paths.project.upload.path) !== null;
  const onUploadsList = useMatch(paths.project.uploads.path) !== null;
  const onUploadPreview = useMatch(paths.project.uploadPreview.path) !== null;
  const onUploadsPage = onUploadsList || onUploadPreview;
  const onReviewPage = useMatch(paths.project.review.path) !== null;
  const onTrailPage = useMatch(paths.project.trail.path) !== null;
  const onHrPage = useMatch(paths.project.hr.path) !== null;
  const onSettingsPage = useMatch(paths.project.settings.path) !== null;
  const onTargetsPage = !onMembersPage && !onUploadPage && !onUploadsPage && !onReviewPage && !onTrailPage && !onHrPage && !onSettingsPage;

  return (
    <div className="flex min-h-screen flex-col bg-paper text-ink">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-10 focus:bg-paper focus:px-3 focus:py-2"
      >
        Skip to content
      </a>
      <header className="border-b border-rule bg-paper-deep" data-print="hide">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-8 gap-y-2 px-6 py-3">
          <Link to={paths.home.getHref()} aria-label="Starledger, home">
            <Wordmark />
          </Link>
          <nav aria-label="Main" className="flex flex-wrap items-center gap-5">
            <NavLink to={paths.home.getHref()} end className={navLinkClasses}>
              Home
            </NavLink>
            <NavLink to={paths.calculator.getHref()} className={navLinkClasses}>
              Calculator
            </NavLink>
            {isSiteAdmin ? (
              <>
                <NavLink to={paths.admin.users.getHref()} className={navLinkClasses}>
                  Users
                </NavLink>
                <NavLink to={paths.admin.mail.getHref()} className={navLinkClasses}>
                  Caught mail
                </NavLink>
              </>
            ) : null}
          </nav>
          <div className="ml-auto flex flex-wrap items-center gap-3">
            <ThemeToggle />
            <DimToggle />
            <span className="text-sm text-ink" data-testid="signed-in-user">
              {userName}
            </span>
            <NavLink to={paths.account.tokens.getHref()} className={navLinkClasses}>
              API tokens
            </NavLink>
            <NavLink to={paths.account.mail.getHref()} className={navLinkClasses}>
              Mail
            </NavLink>
            <NavLink to={paths.account.password.getHref()} className={navLinkClasses}>
              Password
            </NavLink>
            <NavLink to={paths.account.sessions.getHref()} className={navLinkClasses}>
              Sessions
            </NavLink>
            <NavLink to={paths.account.secondFactor.getHref()} className={navLinkClasses}>
              Second factor
            </NavLink>
            <NavLink to={paths.account.data.getHref()} className={navLinkClasses}>
              Your data
            </NavLink>
            <button
              type="button"
              onClick={onSignOut}
              disabled={signingOut}
              className="rounded-sm px-2 py-1 text-sm text-brass underline-offset-4 hover:underline disabled:opacity-60"
            >
              {signingOut ? 'Signing out…' : 'Sign out'}
            </button>
          </div>
        </div>
        {projectPending ? (
          <div className="border-t border-rule" aria-hidden="true">
            <div className={PROJECT_BAR} />
          </div>
        ) : null}
        {project ? (
          <div className="border-t border-rule">
            <div className={cn(PROJECT_BAR, 'flex flex-wrap items-center gap-x-6 gap-y-1')}>
              <p className="text-sm">
                <span className="text-xs font-semibold tracking-[0.18em] text-brass-deep uppercase">{project.code}</span>{' '}
                <span className="font-serif font-semibold">{project.name}</span>
              </p>
              <nav aria-label="Project" className="flex flex-wrap items-center gap-x-5 gap-y-1">
                <Link
                  to={paths.project.root.getHref(project.id)}
                  className={navLinkClasses({ isActive: onTargetsPage })}
                  aria-current={onTargetsPage ? 'page' : undefined}
                >
                  Targets
                </Link>
                {project.canUpload ? (
                  <NavLink to={paths.project.upload.getHref(project.id)} className={navLinkClasses}>
                    Upload
                  </NavLink>
                ) : null}
                <Link
                  to={paths.project.uploads.getHref(project.id)}
                  className={navLinkClasses({ isActive: onUploadsPage })}
                  aria-current={onUploadsPage ? 'page' : undefined}
                >
                  Uploads
                </Link>
                <NavLink to={paths.project.hr.getHref(project.id)} className={navLinkClasses}>
                  HR diagram
                </NavLink>
                {project.canReadQueue ? (
                  <NavLink to={paths.project.review.getHref(project.id)} className={navLinkClasses}>
                    Review
                  </NavLink>
                ) : null}
                {project.canReadTrail ? (
                  <NavLink to={paths.project.trail.getHref(project.id)} className={navLinkClasses}>
                    Trail
                  </NavLink>
                ) : null}
                <NavLink to={paths.project.members.getHref(project.id)} className={navLinkClasses}>
                  Members
                </NavLink>
                {project.canManageSummary ? (
                  <NavLink to={paths.project.summary.getHref(project.id)} className={navLinkClasses}>
                    Summary
                  </NavLink>
                ) : null}
                {project.canManageSettings ? (
                  <NavLink to={paths.project.settings.getHref(project.id)} className={navLinkClasses}>
                    Settings
                  </NavLink>
                ) : null}
              </nav>
            </div>
          </div>
        ) : null}
        <div className={cn('h-0.5', busy ? 'animate-pulse bg-brass' : 'bg-transparent')} aria-hidden="true" />
      </header>
      {signOutError ? (
        <div role="alert" className="mx-auto w-full max-w-6xl px-6 pt-4 text-sm">
          <span className="font-semibold text-alert">Error:</span> Sign-out failed. {signOutError}
        </div>
      ) : null}
      <main id="main" className="mx-auto w-full max-w-6xl flex-1 px-6 py-8">
        {children}
      </main>
      <footer className="border-t border-rule" data-print="hide">
        <div className="mx-auto flex max-w-6xl flex-wrap gap-x-6 gap-y-1 px-6 py-4 text-sm text-ink-soft">
          <Link to={paths.privacy.getHref()} className={linkClasses}>
            Privacy notice
          </Link>
        </div>
      </footer>
    </div>
  );
}
