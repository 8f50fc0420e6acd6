import { createBrowserRouter, Navigate, RouterProvider, type RouteObject } from 'react-router';
import { LoadingState } from '../components/ui/states';
import { paths } from '../lib/paths';
import { AppLayout } from './layout/app-layout';
import { RequireRole, RequireSession } from './layout/require-session';
import { RouteError } from './layout/route-error';

/**
 * Every page is its own lazily loaded chunk: the first load carries only the shell and the page it
 * opens, and Chart.js arrives with the first page that draws a chart.
 */
const page = (load: () => Promise<{ default: React.ComponentType }>) => async () => ({
  Component: (await load()).default,
});

export const routes: RouteObject[] = [
  {
    errorElement: <RouteError />,
    hydrateFallbackElement: <LoadingState />,
    children: [
      { path: paths.signIn.path, lazy: page(() => import('./routes/sign-in')) },
      { path: paths.acceptInvitation.path, lazy: page(() => import('./routes/accept-invitation')) },
      { path: paths.resetPassword.path, lazy: page(() => import('./routes/reset-password')) },
      {
        element: <RequireSession />,
        children: [
          {
            element: <AppLayout />,
            children: [
              { path: paths.home.path, element: <Navigate to={paths.traces.href()} replace /> },
              { path: paths.traces.path, lazy: page(() => import('./routes/traces')) },
              { path: paths.trace.path, lazy: page(() => import('./routes/trace')) },
              { path: paths.sites.path, lazy: page(() => import('./routes/sites')) },
              { path: paths.site.path, lazy: page(() => import('./routes/site')) },
              { path: paths.circuit.path, lazy: page(() => import('./routes/circuit')) },
              {
                element: <RequireRole ability="canEdit" />,
                children: [{ path: paths.upload.path, lazy: page(() => import('./routes/upload')) }],
              },
              {
                element: <RequireRole ability="canAdminister" />,
                children: [
                  { path: '/admin', element: <Navigate to={paths.adminKeys.href()} replace /> },
                  { path: paths.adminKeys.path, lazy: page(() => import('./routes/admin/api-keys')) },
                  { path: paths.adminUsers.path, lazy: page(() => import('./routes/admin/users')) },
                  { path: paths.adminAudit.path, lazy: page(() => import('./routes/admin/audit')) },
                ],
              },
              { path: '*', lazy: page(() => import('./routes/not-found')) },
            ],
          },
        ],
      },
    ],
  },
];

const router = createBrowserRouter(routes);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
