import type { QueryClient } from '@tanstack/react-query';
import { createBrowserRouter, Navigate, type RouteObject } from 'react-router';
import { LoadingState } from '../components/ui/states';
import { prefetchCircuitPage } from '../features/circuits/api/prefetch';
import { prefetchTracePage } from '../features/traces/api/prefetch';
import { paths } from '../lib/paths';
import { AppLayout } from './layout/app-layout';
import { RequireRole, RequireSession } from './layout/require-session';
import { RouteError } from './layout/route-error';

/**
 * Every page is its own lazily loaded chunk: the first load carries only the shell and the page it
 * opens, and Chart.js arrives with the first page that draws a chart. The import waits one task, so the
 * requests the page's loader starts in the same turn go out first: a chunk that is preloaded already
 * (build/route-preload.ts) is evaluated as soon as it is imported, and the requests would wait for that.
 */
const page = (load: () => Promise<{ default: React.ComponentType }>) => async () => {
  await new Promise((resolve) => setTimeout(resolve, 0));
  return { Component: (await load()).default };
};

/**
 * The routes. Pages whose data is known from the address start their requests in a loader, which runs
 * while the page's code downloads; the loader returns at once (nothing waits on it).
 */
export const createRoutes = (queryClient: QueryClient): RouteObject[] => [
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
              {
                path: paths.trace.path,
                loader: ({ params, request }) => {
                  if (params.traceId) prefetchTracePage(queryClient, params.traceId, new URL(request.url).searchParams);
                  return null;
                },
                lazy: page(() => import('./routes/trace')),
              },
              { path: paths.sites.path, lazy: page(() => import('./routes/sites')) },
              { path: paths.site.path, lazy: page(() => import('./routes/site')) },
              {
                path: paths.circuit.path,
                loader: ({ params }) => {
                  if (params.circuitId) prefetchCircuitPage(queryClient, params.circuitId);
                  return null;
                },
                lazy: page(() => import('./routes/circuit')),
              },
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

/**
 * The dashboard's router. Created when the entry script runs, before React's first render: creating it
 * matches the address and starts the page's lazy code and its loader at once, so the page's requests
 * are on their way while React mounts the shell.
 */
export const createAppRouter = (queryClient: QueryClient) => createBrowserRouter(createRoutes(queryClient));
