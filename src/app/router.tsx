import { useState } from 'react';
import { createBrowserRouter, RouterProvider, type RouteObject } from 'react-router-dom';
import { EditorPage } from '../pages/editor-page';
import { HomePage } from '../pages/home-page';
import { NotFoundPage } from '../pages/not-found-page';
import { SignInPage } from '../pages/sign-in-page';
import { AcceptInvitationPage } from '../pages/accept-invitation-page';
import { ForgotPasswordPage } from '../pages/forgot-password-page';
import { ResetPasswordPage } from '../pages/reset-password-page';
import { ProfilePage } from '../pages/profile-page';
import { TeamPage } from '../pages/team-page';
import { TokensPage } from '../pages/tokens-page';
import { WebhooksPage } from '../pages/webhooks-page';
import { ProfilesPage } from '../pages/profiles-page';
import { OutboxPage } from '../pages/outbox-page';
import { PacksPage } from '../pages/packs-page';
import { PackPage } from '../pages/pack-page';
import { VersionPage } from '../pages/version-page';
import { CurvePage } from '../pages/curve-page';
import { ApiReferencePage } from '../pages/api-reference-page';
import { ActivityPage } from '../pages/activity-page';
import { NoticesPage } from '../pages/notices-page';
import { RootErrorBoundary, RouteErrorBoundary } from './error-boundary';
import { AppLayout } from './layout/app-layout';

/**
 * All routes. The layout route carries a last-resort errorElement; the pathless child catches page
 * errors so they render inside the layout, top bar included.
 */
export const routes: RouteObject[] = [
  {
    element: <AppLayout />,
    errorElement: <RootErrorBoundary />,
    children: [
      {
        errorElement: <RouteErrorBoundary />,
        children: [
          { index: true, element: <HomePage /> },
          { path: 'sign-in', element: <SignInPage /> },
          { path: 'invite/:token', element: <AcceptInvitationPage /> },
          { path: 'forgot-password', element: <ForgotPasswordPage /> },
          { path: 'reset-password/:token', element: <ResetPasswordPage /> },
          { path: 'profile', element: <ProfilePage /> },
          { path: 'team', element: <TeamPage /> },
          { path: 'team/tokens', element: <TokensPage /> },
          { path: 'team/webhooks', element: <WebhooksPage /> },
          { path: 'team/profiles', element: <ProfilesPage /> },
          { path: 'outbox', element: <OutboxPage /> },
          { path: 'team/activity', element: <ActivityPage /> },
          { path: 'notices', element: <NoticesPage /> },
          { path: 'packs', element: <PacksPage /> },
          { path: 'packs/:pack', element: <PackPage /> },
          { path: 'packs/:pack/versions/:number', element: <VersionPage /> },
          { path: 'packs/:pack/curves/:curve', element: <CurvePage /> },
          { path: 'editor', element: <EditorPage /> },
          { path: 'api-reference', element: <ApiReferencePage /> },
          { path: '*', element: <NotFoundPage /> },
        ],
      },
    ],
  },
];

export function AppRouter() {
  const [router] = useState(() => createBrowserRouter(routes));
  return <RouterProvider router={router} />;
}
