import type { QueryClient } from '@tanstack/react-query';
import { createBrowserRouter, type RouteObject } from 'react-router-dom';
import { Loading } from '../components/page';
import { AcceptInvitationPage } from '../features/auth/components/accept-invitation-page';
import { ForgotPasswordPage } from '../features/auth/components/forgot-password-page';
import { ResetPasswordPage } from '../features/auth/components/reset-password-page';
import { SignInPage } from '../features/auth/components/sign-in-page';
import { AppLayout } from './app-layout';
import { ComingSoonPage } from './coming-soon-page';
import { HomePage } from './home-page';
import { NotFoundPage } from './not-found-page';
import { RoleGuard } from './role-guard';
import { RouteError } from './route-error';
import { appRoutes } from './routes';
import type { AppRoute } from './route-types';
import { requireSession } from './session';

function featureRoute(route: AppRoute): RouteObject {
  const page: RouteObject = route.page
    ? { index: true, lazy: route.page }
    : { index: true, element: <ComingSoonPage title={route.title} summary={route.summary} /> };
  return {
    path: route.path,
    handle: { title: route.title },
    element: <RoleGuard roles={route.roles} />,
    // A failing page shows its error inside the layout, keeping the navigation.
    errorElement: <RouteError />,
    children: [page],
  };
}

/**
 * The whole route tree. Public pages (sign-in, password reset, invitations) sit beside
 * the signed-in app, whose loader requires a session; every page in routes.tsx hangs
 * under it behind its role guard. Exported for tests (createMemoryRouter).
 */
export function buildRoutes(queryClient: QueryClient): RouteObject[] {
  return [
    {
      id: 'root',
      errorElement: <RouteError />,
      hydrateFallbackElement: <Loading />,
      children: [
        { path: 'sign-in', element: <SignInPage /> },
        { path: 'forgot-password', element: <ForgotPasswordPage /> },
        { path: 'reset-password', element: <ResetPasswordPage /> },
        { path: 'invite/:token', element: <AcceptInvitationPage /> },
        {
          id: 'app',
          path: '/',
          loader: requireSession(queryClient),
          element: <AppLayout />,
          errorElement: <RouteError />,
          hydrateFallbackElement: <Loading />,
          children: [
            { index: true, element: <HomePage />, errorElement: <RouteError /> },
            ...appRoutes.map(featureRoute),
            { path: '*', element: <NotFoundPage /> },
          ],
        },
      ],
    },
  ];
}

/** The browser router of the app (data router, lazy feature pages). */
export function createAppRouter(queryClient: QueryClient) {
  return createBrowserRouter(buildRoutes(queryClient));
}
