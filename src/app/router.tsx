import type { ComponentType } from 'react';
import { createBrowserRouter, type RouteObject } from 'react-router-dom';
import { paths } from '@/config/paths';
import { RouteError } from './routes/route-error';
import { RouteLoading } from './routes/route-loading';

/** A page reached without a session (signing in, a link from a mail), outside the signed-in shell. */
function outsideTheWorkbook(path: string, lazy: () => Promise<{ Component: ComponentType }>): RouteObject {
  return { path, HydrateFallback: RouteLoading, ErrorBoundary: RouteError, lazy };
}

/*
 * Every page is its own chunk, loaded when first visited, so the sign-in page
 * does not carry the tables, forms or the calculator's charts.
 */
export const router = createBrowserRouter([
  outsideTheWorkbook(paths.auth.signIn.path, async () => ({ Component: (await import('./routes/sign-in')).SignInRoute })),
  outsideTheWorkbook(paths.auth.forgotPassword.path, async () => ({ Component: (await import('./routes/forgot-password')).ForgotPasswordRoute })),
  outsideTheWorkbook(paths.auth.resetPassword.path, async () => ({ Component: (await import('./routes/reset-password')).ResetPasswordRoute })),
  outsideTheWorkbook(paths.auth.invitation.path, async () => ({ Component: (await import('./routes/invitation')).InvitationRoute })),
  outsideTheWorkbook(paths.privacy.path, async () => ({ Component: (await import('./routes/privacy')).PrivacyRoute })),
  {
    path: paths.home.path,
    HydrateFallback: RouteLoading,
    ErrorBoundary: RouteError,
    lazy: async () => ({ Component: (await import('./routes/app-root')).AppRoot }),
    children: [
      {
        // A pathless layer so that a page's error shows inside the shell, with the navigation still there.
        ErrorBoundary: RouteError,
        children: [
          { index: true, lazy: async () => ({ Component: (await import('./routes/home')).HomeRoute }) },
          { path: paths.project.root.path, lazy: async () => ({ Component: (await import('./routes/project')).ProjectRoute }) },
          {
            path: paths.project.newTarget.path,
            lazy: async () => ({ Component: (await import('./routes/target-new')).NewTargetRoute }),
          },
          { path: paths.project.target.path, lazy: async () => ({ Component: (await import('./routes/target')).TargetRoute }) },
          {
            path: paths.project.editTarget.path,
            lazy: async () => ({ Component: (await import('./routes/target-edit')).EditTargetRoute }),
          },
          { path: paths.project.members.path, lazy: async () => ({ Component: (await import('./routes/members')).MembersRoute }) },
          {
            path: paths.project.settings.path,
            lazy: async () => ({ Component: (await import('./routes/project-settings')).ProjectSettingsRoute }),
          },
          { path: paths.project.upload.path, lazy: async () => ({ Component: (await import('./routes/upload')).UploadRoute }) },
          { path: paths.project.uploads.path, lazy: async () => ({ Component: (await import('./routes/uploads')).UploadsRoute }) },
          {
            path: paths.project.uploadPreview.path,
            lazy: async () => ({ Component: (await import('./routes/upload-preview')).UploadPreviewRoute }),
          },
          { path: paths.project.review.path, lazy: async () => ({ Component: (await import('./routes/review')).ReviewRoute }) },
          { path: paths.project.trail.path, lazy: async () => ({ Component: (await import('./routes/trail')).TrailRoute }) },
          { path: paths.project.summary.path, lazy: async () => ({ Component: (await import('./routes/summary')).SummaryRoute }) },
          { path: paths.project.hr.path, lazy: async () => ({ Component: (await import('./routes/hr-diagram')).HrDiagramRoute }) },
          { path: paths.account.tokens.path, lazy: async () => ({ Component: (await import('./routes/account-tokens')).AccountTokensRoute }) },
          { path: paths.account.mail.path, lazy: async () => ({ Component: (await import('./routes/account-mail')).AccountMailRoute }) },
          { path: paths.account.password.path, lazy: async () => ({ Component: (await import('./routes/account-password')).AccountPasswordRoute }) },
          { path: paths.account.sessions.path, lazy: async () => ({ Component: (await import('./routes/account-sessions')).AccountSessionsRoute }) },
          {
            path: paths.account.secondFactor.path,
            lazy: async () => ({ Component: (await import('./routes/account-second-factor')).AccountSecondFactorRoute }),
          },
          { path: paths.account.data.path, lazy: async () => ({ Component: (await import('./routes/account-data')).AccountDataRoute }) },
          { path: paths.admin.mail.path, lazy: async () => ({ Component: (await import('./routes/admin-mail')).AdminMailRoute }) },
          { path: paths.admin.users.path, lazy: async () => ({ Component: (await import('./routes/admin-users')).AdminUsersRoute }) },
          { path: paths.calculator.path, lazy: async () => ({ Component: (await import('./routes/calculator')).CalculatorRoute }) },
          { path: paths.apiReference.path, lazy: async () => ({ Component: (await import('./routes/api-reference')).ApiReferenceRoute }) },
          { path: '*', lazy: async () => ({ Component: (await import('./routes/not-found')).NotFoundRoute }) },
        ],
      },
    ],
  },
]);
